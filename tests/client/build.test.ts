import { describe, expect, it } from 'vitest';
import { build } from 'vite';
import { mkdtempSync, readFileSync, readdirSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

describe('the client', () => {
  it('builds with Vite, with its fonts shipped in the bundle rather than fetched', async () => {
    const outDir = mkdtempSync(join(tmpdir(), 'afterwatch-build-'));
    await build({ logLevel: 'silent', build: { outDir, emptyOutDir: true } });
    const html = readFileSync(join(outDir, 'index.html'), 'utf8');
    expect(html).toContain('<div id="root">');
    expect(html).not.toMatch(/fonts\.googleapis|https?:\/\/(?!127\.0\.0\.1)[a-z0-9.-]+\.[a-z]{2,}\//i);
    const assets = readdirSync(join(outDir, 'assets'));
    expect(assets.some((f) => f.endsWith('.woff2'))).toBe(true);
    const css = assets.filter((f) => f.endsWith('.css')).map((f) => readFileSync(join(outDir, 'assets', f), 'utf8')).join('\n');
    expect(css).toMatch(/Roboto Mono/);
    expect(css).not.toMatch(/@import\s+url\(\s*["']?https?:/);
  }, 120_000);
});
