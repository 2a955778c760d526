// A fleet fed only past data (as a replay of a recorded weekend is): the board measures time in state on
// the units' own clock, so a purge replayed from two days ago does not read "2 d" beside its countdown.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
import { ADMIN, startTestService, type TestService } from '../helpers/service';
import { connectGateway, provision, type TestGateway } from '../helpers/gateway';
import { MessageSeq } from '../helpers/messages';
import { buildClient, collectPageErrors, launchBrowser, screenshot, signIn } from './browser-harness';

let t: TestService;
let browser: Browser;
const gateways: TestGateway[] = [];

beforeAll(async () => {
  const [staticDir, b] = await Promise.all([buildClient(), launchBrowser()]);
  browser = b;
  t = await startTestService({}, { staticDir });
}, 120_000);

afterAll(async () => {
  await Promise.all(gateways.map((g) => g.end()));
  await browser?.close();
  await t?.stop();
});

describe('the board during a replay of past data', () => {
  it('counts a replayed purge\'s time in state on the unit\'s clock, beside its countdown', async () => {
    const token = await t.token();
    const t0 = Date.now() - 2 * 24 * 3600_000;
    for (const id of ['RP-1', 'RP-2', 'RP-3']) {
      const g = await provision(t.api, token, { id, purgeSeconds: 600 });
      const gw = await connectGateway(t.mqttUrl, g.gatewayId, g.secret);
      gateways.push(gw);
      const m = new MessageSeq(1);
      await gw.publish('telemetry', m.telemetry(t0, 'on', 13.9));
      await gw.publish('telemetry', m.telemetry(t0 + 1000, 'off', 12.6));
      await gw.publish('telemetry', m.telemetry(t0 + 6000, 'off', 12.6));
    }
    const context = await browser.newContext({ viewport: { width: 1440, height: 900 } });
    const page = await context.newPage();
    const errors = collectPageErrors(page);
    await signIn(page, t.url, ADMIN.email, ADMIN.password);
    await page.goto(`${t.url}/board`);
    const row = page.locator('tbody tr', { has: page.locator('a[href="/units/RP-1"]') });
    await row.getByText('Purge in progress').waitFor({ timeout: 3000 });
    const text = await row.innerText();
    const [, min, sec] = text.match(/(\d+):(\d\d) left/)!;
    const left = Number(min) * 60 + Number(sec);
    // 600 s purge; at least the 5 s to the unit's latest message are gone.
    expect(left).toBeLessThanOrEqual(595);
    // Read from the same snapshot of the row as the countdown, so both come from one tick.
    const inState = text.match(/(\d+) s\s*\(unit clock\)/);
    expect(inState).not.toBeNull();
    // Time in state and the countdown read the same clock: together they make the purge's length (±1 s of rounding).
    expect(Math.abs(Number(inState![1]) + left - 600)).toBeLessThanOrEqual(1);
    await screenshot(page, 'board-replay');
    expect(errors).toEqual([]);
    await context.close();
  });
});
