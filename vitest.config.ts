import { defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    include: ['tests/**/*.test.ts', 'tests/**/*.test.tsx'],
    globalSetup: ['tests/global-setup.ts'],
    setupFiles: ['tests/setup-file.ts'],
    testTimeout: 30_000,
    hookTimeout: 120_000,
    fileParallelism: true,
    maxWorkers: 2,
    pool: 'forks',
  },
});
