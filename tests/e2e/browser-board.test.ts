// The board, the alert banner, the alerts page and the unit page in headless Chromium, against the real
// service serving the built client, while real mqtt.js gateways publish.
import { createServer, connect, type AddressInfo, type Socket } from 'node:net';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { startTestService, type TestService } from '../helpers/service';
import { connectGateway, provision, type TestGateway } from '../helpers/gateway';
import { MessageSeq } from '../helpers/messages';
import { until } from '../helpers/until';
import { encodeDm1 } from '../../shared/j1939/dm1';
import { bytesToHex } from '../../shared/j1939/hex';
import { encodeCanId } from '../../shared/j1939/can-id';
import { buildClient, collectPageErrors, launchBrowser, screenshot, signIn } from './browser-harness';

/** A TCP relay to the service; `down()` cuts every connection and refuses new ones until `up()`. */
async function startRelay(targetPort: string) {
  const sockets = new Set<Socket>();
  let refusing = false;
  const server = createServer((client) => {
    if (refusing) return client.destroy();
    const upstream = connect(Number(targetPort), '127.0.0.1');
    for (const s of [client, upstream]) {
      sockets.add(s);
      s.on('close', () => sockets.delete(s));
      s.on('error', () => s.destroy());
    }
    client.pipe(upstream).pipe(client);
  });
  await new Promise<void>((res) => server.listen(0, '127.0.0.1', res));
  const { port } = server.address() as AddressInfo;
  return {
    url: `http://127.0.0.1:${port}`,
    down() {
      refusing = true;
      for (const s of sockets) s.destroy();
    },
    up() {
      refusing = false;
    },
    close: () => {
      for (const s of sockets) s.destroy();
      return new Promise<void>((res) => server.close(() => res()));
    },
  };
}

const MONITOR = { email: 'monitor@test.local', password: 'monitor-password-1' };

let t: TestService;
let browser: Browser;
let context: BrowserContext;
let page: Page;
let errors: string[];
let admin: string;
const gateways: TestGateway[] = [];

async function gatewayFor(id: string, purgeSeconds: number) {
  const g = await provision(t.api, admin, { id, purgeSeconds, depot: 'North yard' });
  const gw = await connectGateway(t.mqttUrl, g.gatewayId, g.secret);
  gateways.push(gw);
  return gw;
}

const row = (unitId: string) => page.locator('tbody tr', { has: page.locator(`a[href="/units/${unitId}"]`) });
const countdownOf = async (unitId: string) => {
  const text = (await row(unitId).locator('[data-state="purging"]').innerText()).match(/(\d+):(\d\d) left/);
  if (!text) throw new Error('no countdown shown');
  return Number(text[1]) * 60 + Number(text[2]);
};

beforeAll(async () => {
  const [staticDir, b] = await Promise.all([buildClient(), launchBrowser()]);
  browser = b;
  // Alerts escalate after 0.6 s unacknowledged, so the escalation mark can be seen arriving live.
  t = await startTestService({ ALERT_ESCALATE_MINUTES: '0.01' }, { staticDir });
  admin = await t.token();
  const made = await t.api.post('/api/users').set('Authorization', `Bearer ${admin}`).send({ email: MONITOR.email, name: 'Night monitor', role: 'monitor', password: MONITOR.password });
  if (made.status !== 201) throw new Error(`monitor: ${made.status}`);
  context = await browser.newContext({ viewport: { width: 1440, height: 900 } });
  page = await context.newPage();
  // A wait that never ends fails on its own locator, before the test's time is up, so the report names it.
  page.setDefaultTimeout(15_000);
  errors = collectPageErrors(page);
  // Counts the tones the page makes with the Web Audio API, to see the alert sound is generated in the page.
  await page.addInitScript(() => {
    const w = window as unknown as { __tones: number };
    w.__tones = 0;
    const create = AudioContext.prototype.createOscillator;
    AudioContext.prototype.createOscillator = function (this: AudioContext) {
      w.__tones += 1;
      return create.call(this);
    };
  });
  page.on('request', (r) => {
    if (r.resourceType() === 'media' || /\.(mp3|wav|ogg|m4a)$/i.test(r.url())) errors.push(`audio fetched: ${r.url()}`);
  });
}, 120_000);

afterAll(async () => {
  await Promise.all(gateways.map((g) => g.end()));
  await browser?.close();
  await t?.stop();
});

describe('the board in a browser', () => {
  it('a monitor signs in and lands on the board; a purge shows with a ticking countdown, then "Safe to isolate", without reload', async () => {
    const gw = await gatewayFor('BR-1', 60);
    await signIn(page, t.url, MONITOR.email, MONITOR.password);
    // The page after sign-in is the board for a monitor.
    await page.waitForURL((u) => u.pathname === '/board');
    await page.getByRole('status').filter({ hasText: 'Live' }).waitFor();
    await row('BR-1').waitFor();

    const m = new MessageSeq(1);
    const t0 = Date.now() - 1000;
    await gw.publish('telemetry', m.telemetry(t0, 'on', 13.9, { ambientC: 3 }));
    await gw.publish('telemetry', m.telemetry(t0 + 500, 'off', 12.6, { ambientC: 3 }));
    await row('BR-1').getByText('Purge in progress').waitFor({ timeout: 3000 });
    const first = await countdownOf('BR-1');
    // 60 s purge, key-off 0.5 s before now (the engine's purge window, protocol rule 8).
    expect(first).toBeGreaterThan(50);
    expect(first).toBeLessThanOrEqual(60);
    await page.waitForTimeout(2100);
    const later = await countdownOf('BR-1');
    expect(later).toBeLessThan(first); // ticks in the browser, no new message needed
    expect(await row('BR-1').innerText()).toMatch(/12\.60 V/);
    expect(await row('BR-1').innerText()).toMatch(/3\.0 °C/);
    // The count tile for purging units shows it too.
    expect(await page.getByRole('button', { name: /Purge in progress\s*1/ }).count()).toBe(1);
    await screenshot(page, 'board-purging');

    // The controller goes to sleep: the purge completed (gateway protocol: ecmAwake false ends it early).
    await gw.publish('telemetry', m.telemetry(t0 + 30_000, 'off', 12.5, { ecmAwake: false, ambientC: 3 }));
    await row('BR-1').getByText('Safe to isolate').waitFor({ timeout: 3000 });
    expect(await row('BR-1').locator('[data-state="purging"]').count()).toBe(0);
    await screenshot(page, 'board-safe');
  });

  it('an interrupted purge raises the banner at once; the monitor acknowledges it there, and the alerts page shows who', async () => {
    const gw = await gatewayFor('BR-2', 120);
    await row('BR-2').waitFor();
    const m = new MessageSeq(3);
    const t0 = Date.now() - 60_000;
    await gw.publish('telemetry', m.telemetry(t0, 'on', 13.8, { ambientC: -14 }));
    await gw.publish('telemetry', m.telemetry(t0 + 1000, 'off', 12.6, { ambientC: -14 }));
    // Supply lost 20 s into the purge.
    await gw.publish('power', m.power(t0 + 21_000, 'supply-lost', 1.1));

    const banner = page.getByRole('article', { name: /Purge interrupted: unit BR-2/ });
    await banner.waitFor({ timeout: 3000 });
    const text = await banner.innerText();
    expect(text).toContain('20 s');
    expect(text).toContain('-14.0 °C');
    // -14 °C is at or below the DEF freezing point of about -11 °C (ISO 22241-1): band "frozen".
    expect(text).toMatch(/Probably frozen/);
    expect(text).toMatch(/Restore battery power, key on, then key off and wait for 'Safe to isolate'/);
    expect(text).toMatch(/manufacturer's procedure/);
    await expect.poll(() => row('BR-2').getByText('Purge interrupted').count()).toBe(1);
    // Left unacknowledged past the set time, it escalates; the banner marks it without a reload.
    await banner.getByText('Escalated').waitFor({ timeout: 5000 });
    await screenshot(page, 'alert-banner');
    // Three short tones, made in the page (no audio file is fetched: see the request check above).
    expect(await page.evaluate(() => (window as unknown as { __tones: number }).__tones)).toBe(3);

    await banner.getByLabel('Comment (optional)').fill('Driver called, restoring power');
    await banner.getByRole('button', { name: 'Acknowledge' }).click();
    await banner.waitFor({ state: 'detached', timeout: 3000 });
    // The mute choice is remembered in this browser across a reload.
    await page.getByRole('button', { name: 'Alert sound on' }).click();
    await page.reload();
    await page.getByRole('button', { name: 'Alert sound off' }).waitFor();

    await page.getByRole('link', { name: 'Alerts', exact: true }).click();
    await page.getByRole('tab', { name: 'Acknowledged' }).click();
    const alertRow = page.locator('tbody tr', { hasText: 'BR-2' });
    await alertRow.waitFor();
    const rowText = await alertRow.innerText();
    expect(rowText).toContain('Acknowledged');
    expect(rowText).toContain(MONITOR.email);
    expect(rowText).toContain('Driver called, restoring power');
    expect(rowText).toMatch(/escalated/i);
    await screenshot(page, 'alerts-acknowledged');

    await alertRow.getByRole('button', { name: 'Resolve' }).click();
    const dialog = page.getByRole('dialog');
    await dialog.getByLabel('Comment (optional)').fill('Purge rerun, safe to isolate');
    await dialog.getByRole('button', { name: 'Resolve' }).click();
    await alertRow.waitFor({ state: 'detached', timeout: 3000 });
    await page.getByRole('tab', { name: 'Resolved' }).click();
    const resolved = page.locator('tbody tr', { hasText: 'BR-2' });
    await resolved.waitFor();
    expect(await resolved.innerText()).toContain('Purge rerun, safe to isolate');
    expect(await resolved.getByRole('button').count()).toBe(0);
  });

  it('a technician lands on the units list and sees alerts read-only, with no acknowledge or resolve', async () => {
    await t.api.post('/api/users').set('Authorization', `Bearer ${admin}`).send({ email: 'tech@test.local', name: 'Workshop', role: 'technician', password: 'technician-password-1' });
    const other = await browser.newContext({ viewport: { width: 1440, height: 900 } });
    const tech = await other.newPage();
    await signIn(tech, t.url, 'tech@test.local', 'technician-password-1');
    await tech.waitForURL((u) => u.pathname === '/units');
    await tech.goto(`${t.url}/alerts?status=all`);
    await tech.locator('tbody tr', { hasText: 'BR-2' }).waitFor();
    expect(await tech.getByRole('button', { name: /Acknowledge|Resolve/ }).count()).toBe(0);
    expect(await tech.getByText('Monitors and administrators acknowledge and resolve them.').count()).toBe(1);
    await other.close();
  });

  it('the unit page draws the readings chart and shows the interrupted episode in plain words', async () => {
    await page.goto(`${t.url}/units/BR-2`);
    await page.getByRole('heading', { name: 'BR-2' }).waitFor();
    // The chart redraws (a new canvas) when its readings arrive or its width settles: ask until one is laid out.
    const box = await until(async () => {
      const b = await page.locator('.afterwatch-chart canvas').first().boundingBox().catch(() => null);
      return b && b.width > 0 ? b : null;
    }, 10_000);
    expect(box.width).toBeGreaterThan(300);
    const episode = page.locator('[data-episode-outcome="interrupted"]');
    await episode.waitFor();
    const text = await episode.innerText();
    expect(text).toContain('Purge interrupted');
    expect(text).toContain('supply lost');
    expect(text).toContain('20.0 s');
    expect(text).toMatch(/Probably frozen/);
    const timeline = await page.getByRole('list', { name: 'Timeline' }).innerText();
    expect(timeline).toContain('Key off');
    expect(timeline).toContain('Supply lost');
    await screenshot(page, 'unit-page', true);
  });

  it('the unit page lists a DM1 fault with its FMI in words, the lamps that are on, and a link to the purge that explains it', async () => {
    const gw = await gatewayFor('BR-5', 120);
    const m = new MessageSeq(7);
    const t0 = Date.now() - 30 * 60_000;
    await gw.publish('telemetry', m.telemetry(t0, 'on', 13.9, { ambientC: 1 }));
    await gw.publish('telemetry', m.telemetry(t0 + 1_000, 'off', 12.6, { ambientC: 1 }));
    await gw.publish('power', m.power(t0 + 31_000, 'supply-lost', 1.0));
    m.nextBoot();
    const restart = Date.now() - 60_000;
    await gw.publish('power', m.power(restart, 'boot', 12.4, { ts: t0 + 31_000, cause: 'supply-lost' }));
    await gw.publish('telemetry', m.telemetry(restart + 1_000, 'on', 12.3, { ambientC: 1 }));
    // SAE J1939-73 DM1: amber lamp on, one DTC. SPN 520250 lies in the manufacturer-assigned range
    // (SAE J1939-71: 520192–524287), an invented code; FMI 4 = voltage below normal (J1939-73 FMI table).
    const dm1 = bytesToHex(encodeDm1({ lamps: { mil: 'off', redStop: 'off', amberWarning: 'on', protect: 'off' }, dtcs: [{ spn: 520250, fmi: 4, occurrenceCount: 2 }] }));
    const id = encodeCanId({ priority: 6, pgn: 65226, sourceAddress: 0 });
    await gw.publish('can', m.can(restart + 3_000, [{ t: restart + 2_500, id, data: dm1 }]));

    await page.goto(`${t.url}/units/BR-5`);
    const fault = page.locator('tbody tr', { hasText: '520250' });
    await fault.waitFor();
    const text = await fault.innerText();
    expect(text).toContain('Voltage below normal');
    expect(text).toContain('Amber warning');
    expect(text).not.toContain('Red stop');
    const link = fault.getByRole('link', { name: /Purge interrupted/ });
    const [episode] = (await t.api.get('/api/episodes?unitId=BR-5').set('Authorization', `Bearer ${admin}`)).body as { id: number }[];
    expect(await link.getAttribute('href')).toBe(`#episode-${episode.id}`);
    expect(await page.locator(`#episode-${episode.id}`).innerText()).toContain('30.0 s');
    await screenshot(page, 'unit-page-fault', true);
  });

  it('after the connection drops the indicator says "Reconnecting…", and on reconnect the board catches up with what it missed', async () => {
    const gw = await gatewayFor('BR-4', 300);
    // The browser reaches the service through a TCP relay that the test can cut, like a dropped network.
    const relay = await startRelay(new URL(t.url).port);
    const other = await context.newPage();
    try {
      await signIn(other, relay.url, MONITOR.email, MONITOR.password);
      await other.goto(`${relay.url}/board?q=BR-4`);
      const r = other.locator('tbody tr', { has: other.locator('a[href="/units/BR-4"]') });
      await r.waitFor();
      await other.getByRole('status').filter({ hasText: 'Live' }).waitFor();
      relay.down();
      await other.getByRole('status').filter({ hasText: 'Reconnecting…' }).waitFor({ timeout: 3000 });
      // While the browser is cut off the unit keys on: the feed's delta never reaches it.
      const m = new MessageSeq(1);
      await gw.publish('telemetry', m.telemetry(Date.now() - 500, 'on', 13.9));
      await other.waitForTimeout(300);
      expect(await r.getByText('Key on').count()).toBe(0);
      relay.up();
      // Back-off is at most a few seconds after a short outage (1 s steps, doubled, jittered).
      await other.getByRole('status').filter({ hasText: 'Live' }).waitFor({ timeout: 10_000 });
      // The server's hello made the board refetch what it missed.
      await r.getByText('Key on').waitFor({ timeout: 3000 });
    } finally {
      await other.close();
      await relay.close();
    }
  });

  it('with 2,000 units the board keeps only the rows near the viewport in the page, and search, depot and state tiles filter', async () => {
    const depots = ['East yard', 'West yard'];
    const ids = Array.from({ length: 2000 }, (_, i) => `FL-${String(i).padStart(4, '0')}`);
    // Setup only: 2,000 profiles written in one statement (through POST /api/units one by one this would
    // take longer than the whole suite may). What is under test is the board reading them from GET /api/units.
    await t.service.ctx.sequelize.query(
      `INSERT INTO units (id, name, depot, system_voltage, purge_seconds, loss_threshold_v, created_at, updated_at)
       SELECT x.id, 'Fleet ' || x.id, x.depot, 24, 120, 12.0, now(), now() FROM unnest($1::text[], $2::text[]) AS x(id, depot)`,
      { bind: [ids, ids.map((_, i) => depots[i % 2])] },
    );
    const total = (await t.api.get('/api/units').set('Authorization', `Bearer ${admin}`)).body.length as number;
    const north = total - 2000; // the units of the tests above
    expect(north).toBeGreaterThan(0);
    await page.goto(`${t.url}/board`);
    await page.getByText(`${total} units`).waitFor();
    const rendered = await page.locator('tbody tr[data-index]').count();
    expect(rendered).toBeGreaterThan(5);
    expect(rendered).toBeLessThan(80);
    await screenshot(page, 'board-fleet');
    // Sorting by unit, descending, brings the last of the 2,000 to the top.
    // Two clicks in one task, before React has rendered the first (the address changes render in a
    // transition): the second must build on the first, or the sort would stay ascending.
    await page.getByRole('button', { name: /^Unit/ }).evaluate((b: HTMLElement) => (b.click(), b.click()));
    await row('FL-1999').waitFor();
    await page.getByRole('searchbox').fill('FL-0042');
    await row('FL-0042').waitFor();
    expect(await page.locator('tbody tr[data-index], tbody tr:not([aria-hidden])').count()).toBe(1);
    // Clearing the search and picking a depot at once (as a quick hand can): the depot must not bring the
    // old search back. Both changes are made in one task, as React would see them under load.
    await page.evaluate(() => {
      const search = document.querySelector<HTMLInputElement>('input[type=search]')!;
      const depot = [...document.querySelectorAll('label')].find((l) => l.textContent?.startsWith('Depot'))!.querySelector('select')!;
      Object.getOwnPropertyDescriptor(HTMLInputElement.prototype, 'value')!.set!.call(search, '');
      search.dispatchEvent(new Event('input', { bubbles: true }));
      Object.getOwnPropertyDescriptor(HTMLSelectElement.prototype, 'value')!.set!.call(depot, 'North yard');
      depot.dispatchEvent(new Event('change', { bubbles: true }));
    });
    await page.getByText(`${north} of ${total} units`).waitFor();
    expect(await page.getByRole('searchbox').inputValue()).toBe('');
    await page.getByRole('button', { name: /Purge interrupted\s*1/ }).click();
    await page.getByText(`1 of ${total} units`).waitFor();
    await row('BR-2').waitFor();
    expect(errors).toEqual([]);
  }, 60_000);
});
