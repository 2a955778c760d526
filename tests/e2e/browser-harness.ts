// Shared by the browser tests: the built client, headless Chromium kept off the network, sign-in, screenshots.
import { mkdirSync, mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { build } from 'vite';
import { chromium, type Browser, type Page } from 'playwright-core';

/** Builds the client as shipped (vite build) into a fresh temp folder and returns it. */
export async function buildClient(): Promise<string> {
  const outDir = mkdtempSync(join(tmpdir(), 'afterwatch-client-'));
  await build({ logLevel: 'silent', build: { outDir, emptyOutDir: true } });
  return outDir;
}

export function launchBrowser(): Promise<Browser> {
  return chromium.launch({
    executablePath: '/usr/bin/chromium',
    args: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
  });
}

/** Signs in through the form, as a person would, and waits for the page after sign-in. */
export async function signIn(page: Page, baseUrl: string, email: string, password: string) {
  await page.goto(`${baseUrl}/sign-in`);
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(password);
  await Promise.all([page.waitForURL((u) => !u.pathname.startsWith('/sign-in')), page.getByRole('button', { name: /sign in/i }).click()]);
}

const SHOTS = join(process.cwd(), 'test-results', 'screenshots');

export async function screenshot(page: Page, name: string, fullPage = false) {
  mkdirSync(SHOTS, { recursive: true });
  await page.screenshot({ path: join(SHOTS, `${name}.png`), fullPage });
}

/** Every console error and uncaught exception of a page, to assert the pages ran cleanly. */
export function collectPageErrors(page: Page): string[] {
  const errors: string[] = [];
  page.on('pageerror', (e) => errors.push(e.message));
  page.on('console', (m) => {
    if (m.type() === 'error') errors.push(m.text());
  });
  return errors;
}
