// The roster import in headless Chromium against the real service serving the built client: a bad row
// is shown in the preview and nothing is created; the fixed file imports, with the secrets downloadable once.
import { readFileSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import Papa from 'papaparse';
import type { Browser, Page } from 'playwright-core';
import { ADMIN, startTestService, type TestService } from '../helpers/service';
import { connectGateway } from '../helpers/gateway';
import { buildClient, collectPageErrors, launchBrowser, screenshot, signIn } from './browser-harness';

let t: TestService;
let browser: Browser;
let page: Page;
let errors: string[];

beforeAll(async () => {
  const [staticDir, b] = await Promise.all([buildClient(), launchBrowser()]);
  browser = b;
  t = await startTestService({}, { staticDir });
  const context = await browser.newContext({ viewport: { width: 1440, height: 900 }, acceptDownloads: true });
  page = await context.newPage();
  errors = collectPageErrors(page);
  await signIn(page, t.url, ADMIN.email, ADMIN.password);
}, 180_000);

afterAll(async () => {
  await browser?.close();
  await t?.stop();
});

const HEADER = 'unit_id,name,depot,system_voltage,purge_seconds,gateway_id';
const csvFile = (name: string, lines: string[]) => ({ name, mimeType: 'text/csv', buffer: Buffer.from(lines.join('\n')) });

describe('roster import in a browser', () => {
  it('shows the bad cell of a bad row, creates nothing, then imports the fixed file and offers the secrets once', async () => {
    await page.getByRole('link', { name: 'Roster import' }).click();
    await page.waitForURL((u) => u.pathname === '/admin/roster');
    await page.locator('input[name="roster"]').setInputFiles(csvFile('fleet.csv', [HEADER, 'BR-1,Tipper one,North yard,24,120,gw-br-1', 'BR-2,Van two,North yard,48,120,gw-br-2']));
    await page.getByText('1 problem in fleet.csv').waitFor();
    const bad = page.locator('tr[data-line="3"]');
    await expect.poll(() => bad.innerText()).toContain('system voltage must be 12 or 24, got "48"');
    expect(await bad.locator('td[aria-invalid="true"]').innerText()).toBe('48');
    expect(await page.locator('tr[data-line="2"]').innerText()).toContain('OK');
    expect(await page.getByRole('button', { name: 'Import 2 units' }).isDisabled()).toBe(true);
    await screenshot(page, 'roster-bad-row', true);
    expect((await t.api.get('/api/units').set('Authorization', `Bearer ${await t.token()}`)).body).toEqual([]);

    await page.locator('input[name="roster"]').setInputFiles(csvFile('fleet-fixed.csv', [HEADER, 'BR-1,Tipper one,North yard,24,120,gw-br-1', 'BR-2,Van two,North yard,12,120,gw-br-2']));
    await page.getByText('2 rows, all good: ready to import.').waitFor();
    await page.getByRole('button', { name: 'Import 2 units' }).click();
    await page.getByText('Created 2 units and 2 gateways.').waitFor();
    await screenshot(page, 'roster-imported', true);
    const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('button', { name: 'Download secrets (CSV)' }).click()]);
    expect(download.suggestedFilename()).toBe('gateway-secrets.csv');
    const rows = Papa.parse<Record<string, string>>(readFileSync((await download.path())!, 'utf8').trim(), { header: true }).data;
    expect(rows.map((r) => [r.unit_id, r.gateway_id])).toEqual([['BR-1', 'gw-br-1'], ['BR-2', 'gw-br-2']]);
    // The downloaded secret is the gateway's real credential.
    const gw = await connectGateway(t.mqttUrl, 'gw-br-2', rows[1].secret);
    await gw.end();
    const [template] = await Promise.all([page.waitForEvent('download'), page.getByRole('button', { name: 'Download template' }).click()]);
    expect(readFileSync((await template.path())!, 'utf8').split('\n')[0]).toBe(HEADER);
    expect(errors).toEqual([]);
  });
});
