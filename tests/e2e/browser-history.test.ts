// History filters, server-side paging and the CSV export, the weekly report and the assignments import in headless Chromium,
// against the real service serving the built client, over history made by real mqtt.js gateways.
import { readFileSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import Papa from 'papaparse';
import type { Browser, Page } from 'playwright-core';
import { startTestService, type TestService } from '../helpers/service';
import { buildFleetWeek, N1_NAME } from '../server/planner-a/fleet-week';
import { H, UnitHistory } from '../server/planner-a/unit-history';
import { connectGateway, provision } from '../helpers/gateway';
import { buildClient, collectPageErrors, launchBrowser, screenshot, signIn } from './browser-harness';

const PLANNER = { email: 'planner@test.local', password: 'planner-password-1' };

let t: TestService;
let browser: Browser;
let page: Page;
let errors: string[];

beforeAll(async () => {
  const [staticDir, b] = await Promise.all([buildClient(), launchBrowser()]);
  browser = b;
  t = await startTestService({}, { staticDir });
  const admin = await t.token();
  await buildFleetWeek(t, admin);
  // A 24 V unit parked 30 h with the isolator closed, draining 20 mV/h after 4 h of surface charge.
  const g = await provision(t.api, admin, { id: 'B-24', systemVoltage: 24, depot: 'East' });
  const gw = await connectGateway(t.mqttUrl, g.gatewayId, g.secret);
  await new UnitHistory(gw, 3, 25.2).park(Date.now() - 40 * H, 30, (h) => (h < 4 ? 25.3 + 0.5 * (4 - h) : 25.3 - 0.02 * (h - 4)));
  await gw.end();
  await t.api.post('/api/users').set('Authorization', `Bearer ${admin}`).send({ email: PLANNER.email, name: 'Planner', role: 'planner', password: PLANNER.password }).expect(201);
  const context = await browser.newContext({ viewport: { width: 1440, height: 900 }, acceptDownloads: true });
  page = await context.newPage();
  errors = collectPageErrors(page);
  await signIn(page, t.url, PLANNER.email, PLANNER.password);
}, 180_000);

afterAll(async () => {
  await browser?.close();
  await t?.stop();
});

const bodyRows = () => page.locator('table tbody tr');

describe('history in a browser', () => {
  it('a planner filters by depot and outcome, sorts on the server, pages, and exports exactly the filtered rows', async () => {
    await page.getByRole('link', { name: 'History' }).click();
    await page.waitForURL((u) => u.pathname === '/history');
    await page.getByText('Rows 1–11 of 11').waitFor();
    await page.getByLabel('Depot').selectOption('North');
    await page.getByLabel('Outcome').selectOption('interrupted');
    await page.getByText('Rows 1–4 of 4').waitFor();
    expect(page.url()).toContain('depot=North');
    // Sorting goes to the server: the longest interruption first after one click (descending).
    await page.getByRole('button', { name: 'Into purge' }).click();
    await page.waitForURL((u) => u.searchParams.get('sort') === 'secondsIntoPurge');
    await expect.poll(async () => (await bodyRows().locator('td:nth-child(6)').allInnerTexts()).join('|')).toBe('60 of 120 s|38 of 120 s|20 of 120 s|10 of 120 s');
    await screenshot(page, 'history-filtered');

    const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('button', { name: 'Export CSV' }).click()]);
    expect(download.suggestedFilename()).toMatch(/^episodes-\d{8}-\d{6}\.csv$/);
    const text = readFileSync((await download.path())!, 'utf8');
    const parsed = Papa.parse<Record<string, string>>(text.trim(), { header: true });
    expect(parsed.errors).toEqual([]);
    expect(parsed.data.map((r) => [r.unit_id, r.outcome, r.seconds_into_purge])).toEqual([['N-2', 'interrupted', '60'], ['N-1', 'interrupted', '38'], ['N-1', 'interrupted', '20'], ['N-1', 'interrupted', '10']]);
    expect(parsed.data[1].unit_name).toBe(N1_NAME);
  }, 90_000);

  it('pages through all episodes four at a time with the total from the server, then shows the faults', async () => {
    await page.goto(`${t.url}/history?sort=keyOffAt&dir=asc&pageSize=4`);
    await page.getByText('Rows 1–4 of 11').waitFor();
    await page.getByRole('button', { name: 'Next' }).click();
    await page.getByText('Rows 5–8 of 11').waitFor();
    await page.getByRole('button', { name: 'Next' }).click();
    await page.getByText('Rows 9–11 of 11').waitFor();
    await expect.poll(() => bodyRows().count()).toBe(3);
    expect(await page.getByRole('button', { name: 'Next' }).isDisabled()).toBe(true);
    expect(new URL(page.url()).searchParams.get('page')).toBe('3');
    await page.getByRole('tab', { name: 'Faults' }).click();
    await page.getByText('Rows 1–2 of 2').waitFor();
    expect(await bodyRows().count()).toBe(2);
    await screenshot(page, 'history-faults');
  });

  it('the weekly report shows the week, the repeat offenders first, and the trend chart', async () => {
    await page.goto(`${t.url}/reports?week=2026-W47&weeks=4`);
    await page.getByRole('heading', { name: /Repeat offenders/ }).waitFor();
    await page.getByText('N-1').first().waitFor();
    await expect.poll(() => page.locator('.afterwatch-chart canvas').count()).toBeGreaterThan(0);
    await screenshot(page, 'weekly-report', true);
  });

  it('an assignments file with a bad row is previewed with the error on its cell and cannot be imported', async () => {
    await page.goto(`${t.url}/drivers`);
    const csv = 'driver_code,driver_name,unit_id,from,to\r\nD-9,Driver Nine,S-1,2026-11-30T06:00:00Z,\r\nD-9,,NOPE-1,2026-11-30T06:00:00Z,\r\n';
    await page.getByLabel('Assignments CSV file').setInputFiles({ name: 'assignments.csv', mimeType: 'text/csv', buffer: Buffer.from(csv) });
    await page.getByText('unit_id: no unit NOPE-1').waitFor();
    await expect.poll(() => page.getByRole('button', { name: 'Import all 2 rows' }).isDisabled()).toBe(true);
    await screenshot(page, 'assignments-import-bad-row', true);
  });

  it("a driver's coaching view shows the rate, the trend chart and the latest key-offs", async () => {
    await page.getByRole('link', { name: 'Driver Two' }).first().click();
    await page.getByRole('heading', { name: 'Driver Two (D-2)' }).waitFor();
    await page.getByRole('heading', { name: 'Latest key-offs' }).waitFor();
    expect(await page.getByRole('table', { name: 'Key-off purge episodes' }).locator('tbody tr').count()).toBe(4);
    await screenshot(page, 'driver-coaching', true);
  });

  it('battery drain names the unit to act on and charts its park with the fitted drain', async () => {
    await page.getByRole('link', { name: 'Battery drain' }).click();
    await page.getByRole('button', { name: 'B-24' }).click();
    await page.getByText('Drain too high: find the parasitic load or fit a low-voltage disconnect.').first().waitFor();
    await expect.poll(() => page.locator('.afterwatch-chart canvas').count()).toBeGreaterThan(0);
    await screenshot(page, 'battery-drain', true);
    expect(errors).toEqual([]);
  });
});
