// Depots, the forecast and e-mail in headless Chromium against the real service serving the built client:
// an admin places a depot, fetches the forecast (the local fake) and sees a freeze warning; a planner
// subscribes to the depot; the mail the warning sent shows in the admin's mailbox.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { ADMIN, startTestService, type TestService } from '../helpers/service';
import { addUser, interruptedUnit } from '../server/planner-b/helpers';
import { buildClient, collectPageErrors, launchBrowser, screenshot, signIn } from './browser-harness';

let t: TestService;
let browser: Browser;
let page: Page;
let errors: string[];

beforeAll(async () => {
  const [staticDir, b] = await Promise.all([buildClient(), launchBrowser()]);
  browser = b;
  t = await startTestService({}, { staticDir });
  const admin = await t.token();
  await addUser(t, admin, 'planner');
  await interruptedUnit(t, admin, { id: 'DP-1', depot: 'Lake yard' });
  const context = await browser.newContext({ viewport: { width: 1440, height: 900 } });
  page = await context.newPage();
  errors = collectPageErrors(page);
}, 180_000);

afterAll(async () => {
  await browser?.close();
  await t?.stop();
});

describe('depots, forecast and mail in a browser', () => {
  it('a planner subscribes; an admin places the depot and fetches the forecast; the warning and its mail show', async () => {
    await signIn(page, t.url, 'planner@test.local', 'planner-password-1');
    await page.getByRole('link', { name: 'E-mail alerts' }).click();
    await page.getByLabel('Depot', { exact: true }).selectOption('Lake yard');
    await page.getByRole('button', { name: 'Subscribe' }).click();
    await page.getByRole('list', { name: 'My depots' }).getByText('Lake yard').waitFor();
    await screenshot(page, 'mail-settings');
    await page.getByRole('button', { name: 'Sign out' }).click();

    await signIn(page, t.url, ADMIN.email, ADMIN.password);
    await page.getByRole('link', { name: 'Depots & forecast' }).click();
    await page.getByLabel('Latitude of Lake yard').fill('63.1');
    await page.getByLabel('Longitude of Lake yard').fill('21.6');
    await page.getByRole('button', { name: 'Save' }).click();
    await expect.poll(async () => (await t.api.get('/api/depots').set('Authorization', `Bearer ${await t.token()}`)).body[0].latitude).toBe(63.1);
    t.service.forecastFake!.setSeries(63.1, 21.6, Array.from({ length: 72 }, (_, h) => (h === new Date().getUTCHours() + 10 ? -16.5 : -4)));
    await page.getByRole('button', { name: 'Fetch forecast now' }).click();
    const warning = page.getByRole('list', { name: 'Forecast warnings' }).getByRole('listitem');
    await expect.poll(() => warning.innerText()).toContain('DP-1 at Lake yard: run a full purge before');
    expect(await page.getByRole('table', { name: 'Depots' }).innerText()).toContain('-16.5 °C');
    await screenshot(page, 'depots-forecast', true);

    await page.getByRole('link', { name: 'Mailbox' }).click();
    await page.getByRole('button', { name: /Freezing weather ahead with an unfinished purge: DP-1 at Lake yard/ }).click();
    const message = page.getByRole('article', { name: 'Message' });
    await expect.poll(() => message.innerText()).toContain('Run a full purge before then.');
    expect(await message.innerText()).toContain('to planner@test.local');
    await page.getByRole('button', { name: 'Send the weekly digest now' }).click();
    await page.getByText('Digest sent to planner@test.local.').waitFor();
    await screenshot(page, 'mailbox', true);
    expect(errors).toEqual([]);
  });
});
