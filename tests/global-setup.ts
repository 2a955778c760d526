// One throwaway PostgreSQL cluster for the whole run, in a temporary folder, migrated once into a template
// database; each test file clones the template into a database of its own (tests/helpers/test-db.ts).
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { TestProject } from 'vitest/node';
import { startLocalPostgres } from '../scripts/lib/local-postgres';
import { connectDb, migrate } from '../server/db/index';
import { configureLogger } from '../server/lib/logger';

export default async function setup(project: TestProject) {
  configureLogger('silent');
  const dir = mkdtempSync(join(tmpdir(), 'afterwatch-test-'));
  const pg = await startLocalPostgres({ dataDir: dir, database: 'afterwatch_template' });
  const db = await connectDb(pg.url);
  await migrate(db.sequelize);
  await db.close();
  project.provide('pgAdminUrl', pg.url.replace(/\/afterwatch_template$/, '/postgres'));
  project.provide('pgTemplate', 'afterwatch_template');
  return async () => {
    await pg.stop();
    rmSync(dir, { recursive: true, force: true });
  };
}

declare module 'vitest' {
  export interface ProvidedContext {
    pgAdminUrl: string;
    pgTemplate: string;
  }
}
