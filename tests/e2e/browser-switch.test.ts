// The driver's switch page in headless Chromium: no sign-in, hold then clear while a real gateway publishes,
// and "withdrawn" once an admin revokes the link.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { startTestService, type TestService } from '../helpers/service';
import { connectGateway, provision, type TestGateway } from '../helpers/gateway';
import { MessageSeq } from '../helpers/messages';
import { ADMIN } from '../helpers/service';
import { buildClient, collectPageErrors, launchBrowser, screenshot, signIn } from './browser-harness';

let t: TestService;
let browser: Browser;
let admin: string;
let gw: TestGateway;

beforeAll(async () => {
  const [staticDir, b] = await Promise.all([buildClient(), launchBrowser()]);
  browser = b;
  t = await startTestService({}, { staticDir });
  admin = await t.token();
  const g = await provision(t.api, admin, { id: 'SW-7', purgeSeconds: 90, depot: 'South yard' });
  gw = await connectGateway(t.mqttUrl, g.gatewayId, g.secret);
}, 120_000);

afterAll(async () => {
  await gw?.end();
  await browser?.close();
  await t?.stop();
});

describe('the switch page in a browser', () => {
  it('shows hold with the countdown, then clear, without sign-in; a withdrawn link says so', async () => {
    const issued = await t.api.post('/api/switch-pages/SW-7').set('Authorization', `Bearer ${admin}`);
    expect(issued.status).toBe(201);
    // A phone-sized screen, in a context that never signed in.
    const context = await browser.newContext({ viewport: { width: 390, height: 844 }, deviceScaleFactor: 2 });
    const page: Page = await context.newPage();
    const errors = collectPageErrors(page);
    await page.goto(`${t.url}${issued.body.path}`);
    await page.getByText('SW-7', { exact: true }).waitFor();
    await page.getByText('South yard', { exact: false }).waitFor();
    // Nothing heard from the unit yet.
    await page.locator('[data-indicator="unknown"]').waitFor();
    expect(await page.locator('main').innerText()).toContain('No recent contact — wait and check the light');
    await page.getByText('● Live').waitFor();

    const m = new MessageSeq(0);
    const t0 = Date.now() - 2000;
    await gw.publish('telemetry', m.telemetry(t0, 'on', 13.9));
    await gw.publish('telemetry', m.telemetry(t0 + 1000, 'off', 12.6));
    const hold = page.locator('[data-indicator="hold"][data-rerun="false"]');
    await hold.waitFor({ timeout: 3000 });
    const holdText = await hold.innerText();
    expect(holdText).toContain('HOLD');
    const left = holdText.match(/(\d+):(\d\d)/);
    expect(left).not.toBeNull();
    // 90 s purge, key-off 1 s before now.
    const secondsLeft = Number(left![1]) * 60 + Number(left![2]);
    expect(secondsLeft).toBeGreaterThan(80);
    expect(secondsLeft).toBeLessThanOrEqual(90);
    await screenshot(page, 'switch-hold');

    await gw.publish('telemetry', m.telemetry(t0 + 20_000, 'off', 12.5, { ecmAwake: false }));
    const clear = page.locator('[data-indicator="clear"]');
    await clear.waitFor({ timeout: 3000 });
    expect(await clear.innerText()).toContain('CLEAR');
    expect(await clear.innerText()).toContain('Safe to isolate');
    await screenshot(page, 'switch-clear');

    expect((await t.api.delete('/api/switch-pages/SW-7').set('Authorization', `Bearer ${admin}`)).status).toBe(204);
    await page.getByText('This link was withdrawn').waitFor({ timeout: 3000 });
    expect(errors).toEqual([]);
    await context.close();
  });

  it('after an interrupted purge the page holds and says to run the purge again', async () => {
    const issued = await t.api.post('/api/switch-pages/SW-7').set('Authorization', `Bearer ${admin}`);
    const context = await browser.newContext({ viewport: { width: 390, height: 844 } });
    const page = await context.newPage();
    await page.goto(`${t.url}${issued.body.path}`);
    await page.locator('[data-indicator="clear"]').waitFor();
    const m = new MessageSeq(1);
    const t0 = Date.now() - 30_000;
    await gw.publish('telemetry', m.telemetry(t0, 'on', 13.9));
    await gw.publish('telemetry', m.telemetry(t0 + 1000, 'off', 12.6));
    await gw.publish('power', m.power(t0 + 11_000, 'supply-lost', 0.9));
    const rerun = page.locator('[data-indicator="hold"][data-rerun="true"]');
    await rerun.waitFor({ timeout: 3000 });
    expect(await rerun.innerText()).toContain('Purge was interrupted: restore power, key on, key off and wait');
    await screenshot(page, 'switch-rerun');
    await context.close();
  });

  it('an admin issues pages for the depot\'s units that have none and gets a printable sheet of QR cards', async () => {
    for (const id of ['SW-8', 'SW-9']) await provision(t.api, admin, { id, depot: 'South yard' });
    const context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
    const page = await context.newPage();
    const errors = collectPageErrors(page);
    await signIn(page, t.url, ADMIN.email, ADMIN.password);
    await page.goto(`${t.url}/admin/switch-sheet?depot=${encodeURIComponent('South yard')}`);
    await page.locator('.qr-card').first().waitFor();
    expect(await page.locator('.qr-card').count()).toBe(1); // SW-7 has one from the test before
    await page.getByRole('button', { name: /Issue pages for the 2 units of South yard without one/ }).click();
    await expect.poll(() => page.locator('.qr-card').count()).toBe(3);
    expect(await page.locator('.qr-card svg').count()).toBe(3);
    await page.getByRole('button', { name: /Every unit of South yard has a page/ }).waitFor();
    const sheet = (await t.api.get('/api/switch-pages?depot=South%20yard').set('Authorization', `Bearer ${admin}`)).body as { unitId: string }[];
    expect(sheet.map((e) => e.unitId).sort()).toEqual(['SW-7', 'SW-8', 'SW-9']);
    await screenshot(page, 'switch-sheet');
    await page.emulateMedia({ media: 'print' });
    expect(await page.locator('header').isVisible()).toBe(false);
    await screenshot(page, 'switch-sheet-print', true);
    expect(errors).toEqual([]);
    await context.close();
  });

  it('on the unit page an admin edits the profile and reissues the switch link; a page on the old link says it was withdrawn', async () => {
    const oldPath = (await t.api.post('/api/switch-pages/SW-8').set('Authorization', `Bearer ${admin}`)).body.path as string;
    const context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
    const page = await context.newPage();
    const errors = collectPageErrors(page);
    const phoneContext = await browser.newContext({ viewport: { width: 390, height: 844 } });
    const phone = await phoneContext.newPage();
    await phone.goto(`${t.url}${oldPath}`);
    await phone.getByText('● Live').waitFor();

    await signIn(page, t.url, ADMIN.email, ADMIN.password);
    await page.goto(`${t.url}/units/SW-8`);
    await page.getByRole('heading', { name: 'SW-8' }).waitFor();
    await page.getByRole('button', { name: 'Edit profile' }).click();
    const dialog = page.getByRole('dialog');
    await dialog.getByLabel('Name').fill('Tipper eight');
    await dialog.getByRole('button', { name: 'Save profile' }).click();
    await dialog.waitFor({ state: 'hidden' });
    await page.getByText('Tipper eight').first().waitFor();

    const link = page.getByRole('link', { name: new RegExp(`${oldPath}$`) });
    await link.waitFor();
    await page.getByRole('button', { name: 'Reissue link' }).click();
    await page.getByRole('dialog').getByRole('button', { name: 'Reissue' }).click();
    await page.getByRole('link', { name: /\/switch\// }).first().waitFor();
    await expect.poll(async () => (await page.getByRole('link', { name: /\/switch\// }).first().innerText()).endsWith(oldPath)).toBe(false);
    await phone.getByText('This link was withdrawn').waitFor({ timeout: 3000 });
    await screenshot(page, 'unit-page-admin', true);
    expect(errors).toEqual([]);
    await phoneContext.close();
    await context.close();
  });
});
