// A work order from an alert to closed in headless Chromium against the real service serving the built
// client: a planner opens it from an interrupted-purge alert and assigns it; the technician records the
// coil resistance and uploads a photo; the planner closes it.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { startTestService, type TestService } from '../helpers/service';
import { addUser, interruptedUnit, tinyPng } from '../server/planner-b/helpers';
import { buildClient, collectPageErrors, launchBrowser, screenshot, signIn } from './browser-harness';

let t: TestService;
let browser: Browser;
let admin: string;
let alertId: number;
const errors: string[] = [];

async function pageAs(email: string, password: string): Promise<Page> {
  const context = await browser.newContext({ viewport: { width: 1440, height: 1000 } });
  const page = await context.newPage();
  const mine = collectPageErrors(page);
  page.on('close', () => errors.push(...mine));
  await signIn(page, t.url, email, password);
  return page;
}

beforeAll(async () => {
  const [staticDir, b] = await Promise.all([buildClient(), launchBrowser()]);
  browser = b;
  t = await startTestService({}, { staticDir });
  admin = await t.token();
  await addUser(t, admin, 'planner');
  await addUser(t, admin, 'technician');
  alertId = (await interruptedUnit(t, admin, { id: 'BW-24', depot: 'North yard', systemVoltage: 24 })).id;
}, 180_000);

afterAll(async () => {
  await browser?.close();
  await t?.stop();
});

describe('work order in a browser', () => {
  it('goes from an alert to closed: opened and assigned, coil recorded and judged, photo uploaded, closed', async () => {
    const planner = await pageAs('planner@test.local', 'planner-password-1');
    await planner.getByRole('link', { name: 'Work orders' }).click();
    await planner.waitForURL((u) => u.pathname === '/work-orders');
    await planner.getByLabel('Alert', { exact: true }).selectOption(String(alertId));
    await planner.getByLabel('Technician').selectOption({ label: 'The technician (technician@test.local)' });
    await screenshot(planner, 'work-order-open-form');
    await planner.getByRole('button', { name: 'Open work order' }).click();
    await planner.waitForURL((u) => /^\/work-orders\/\d+$/.test(u.pathname));
    const orderPath = new URL(planner.url()).pathname;
    await planner.getByRole('heading', { name: /Interrupted purge on BW-24/ }).waitFor();
    expect(await planner.getByTestId('work-order-status').innerText()).toBe('Open');

    const tech = await pageAs('technician@test.local', 'technician-password-1');
    await tech.goto(`${t.url}${orderPath}`);
    await tech.getByText('Isolate the battery before working on the relay').waitFor();
    await tech.getByText('Expected on this 24 V system: 200–400 Ω').waitFor();
    await tech.getByLabel('Coil resistance (Ω)').fill('150');
    await tech.getByRole('button', { name: 'Record coil reading' }).click();
    const coil = tech.getByRole('list', { name: 'Recorded checks' }).getByRole('listitem').first();
    await expect.poll(() => coil.innerText()).toContain('150 Ω');
    expect(await coil.innerText()).toContain('Too low');
    expect(await coil.innerText()).toContain('expected 200–400 Ω at 24 V (common practice, no published source)');
    const defForm = tech.getByRole('form', { name: 'DEF lines and pump: freeze damage' });
    await defForm.getByLabel('Result').selectOption('fail');
    await defForm.getByLabel('Note').fill('Dosing line split near the pump');
    await defForm.getByRole('button', { name: 'Record' }).click();
    await tech.getByText('Dosing line split near the pump').waitFor();
    await tech.locator('input[name="photo"]').setInputFiles({ name: 'dosing-line.png', mimeType: 'image/png', buffer: tinyPng() });
    await tech.getByRole('button', { name: 'Upload photo' }).click();
    const img = tech.getByRole('img', { name: 'dosing-line.png' });
    await img.waitFor();
    await expect.poll(() => img.evaluate((el) => (el as HTMLImageElement).naturalWidth)).toBe(1);
    expect(await tech.getByTestId('work-order-status').innerText()).toBe('In progress');
    await screenshot(tech, 'work-order-technician', true);
    await tech.close();

    await planner.reload();
    await planner.getByLabel('Outcome').selectOption('repaired');
    await planner.getByLabel('Closing note').fill('Relay and dosing line replaced; purge run to the end');
    await planner.getByRole('button', { name: 'Close work order' }).click();
    await expect.poll(() => planner.getByTestId('work-order-status').innerText()).toBe('Closed · Repaired');
    await planner.getByRole('img', { name: 'dosing-line.png' }).waitFor();
    await screenshot(planner, 'work-order-closed', true);
    await planner.getByRole('link', { name: '← Work orders' }).click();
    await planner.getByLabel('Show').selectOption('closed');
    await planner.getByRole('cell', { name: /Interrupted purge on BW-24/ }).waitFor();
    await planner.close();
    expect(errors).toEqual([]);
  });
});
