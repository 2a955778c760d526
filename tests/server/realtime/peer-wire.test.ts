// The relay between workers: what goes into each PostgreSQL notification, and what comes back out.
import { describe, expect, it } from 'vitest';
import { MAX_PAYLOAD_BYTES, alertStage, decodeRelay, encodeAlerts, encodeAsk, encodeRelay, type RelayedUnit } from '../../../server/realtime/peer-wire';
import type { AlertView } from '../../../shared/realtime/envelope';

const unit = (i: number, depot = 'North yard'): RelayedUnit => ({
  unitId: `U-${i}`,
  depot,
  version: 1000 + i,
  view: { state: 'purging', stateSince: '2026-12-01T17:02:11.250Z', purgeRemainingS: 87, lastSupplyV: 12.6, lastAmbientC: -4.5, lastSeenAt: '2026-12-01T17:02:14.000Z' },
  remainingMs: 86_420,
});

describe('relay notifications', () => {
  it('a fleet-wide change is cut into notifications each under PostgreSQL\'s 8000-byte payload limit, and reads back whole', () => {
    // PostgreSQL documentation (NOTIFY): the payload must be shorter than 8000 bytes by default.
    // Depot names of 120 characters, most of them two bytes in UTF-8: the limit is in bytes, not characters.
    const units = Array.from({ length: 10_000 }, (_, i) => unit(i, `Dépôt ${'é'.repeat(113)}`));
    const episodes = units.slice(0, 3000).map((u) => u.unitId);
    const payloads = encodeRelay('w2#0a1b2c3d', 'units', 1_764_608_534_000, units, episodes);
    expect(payloads.length).toBeGreaterThan(1);
    for (const p of payloads) expect(Buffer.byteLength(p, 'utf8')).toBeLessThan(8000);
    expect(Math.max(...payloads.map((p) => Buffer.byteLength(p, 'utf8')))).toBeLessThanOrEqual(MAX_PAYLOAD_BYTES);
    const back = payloads.map(decodeRelay);
    expect(back.flatMap((m) => ('units' in m ? m.units : []))).toEqual(units);
    expect(back.flatMap((m) => ('episodes' in m ? m.episodes : []))).toEqual(episodes);
    expect(new Set(back.map((m) => m.from))).toEqual(new Set(['w2#0a1b2c3d']));
    expect(back.every((m) => m.kind === 'units' && m.at === 1_764_608_534_000)).toBe(true);
  });

  it('keeps views without a purge or without contact as they are (nulls included)', () => {
    const quiet: RelayedUnit = { unitId: 'Q-1', depot: 'East', version: 3, remainingMs: null, view: { state: null, stateSince: null, purgeRemainingS: null, lastSupplyV: null, lastAmbientC: null, lastSeenAt: null } };
    const safe: RelayedUnit = { unitId: 'Q-2', depot: 'East', version: 9, remainingMs: null, view: { state: 'safeToIsolate', stateSince: '2026-12-01T18:00:00.000Z', purgeRemainingS: null, lastSupplyV: 25.3, lastAmbientC: null, lastSeenAt: '2026-12-01T18:00:05.000Z' } };
    const [p] = encodeRelay('w1#00000000', 'snapshot', 5, [quiet, safe], []);
    expect(decodeRelay(p)).toEqual({ from: 'w1#00000000', kind: 'snapshot', at: 5, units: [quiet, safe], episodes: [] });
  });

  it('nothing to tell gives no notification; an ask is one small one', () => {
    expect(encodeRelay('w1#00000000', 'units', 0, [], [])).toEqual([]);
    expect(decodeRelay(encodeAsk('w1#00000000'))).toEqual({ from: 'w1#00000000', kind: 'ask' });
  });

  it('a notification that is not a relay message is refused with its reason', () => {
    expect(() => decodeRelay('{"f":"w1"')).toThrow(/not JSON/);
    expect(() => decodeRelay(JSON.stringify({ f: 'w1', k: 'u', t: 1, u: [['U-1', 'x', -1, null, null, null, null, null, null, null]], e: [] }))).toThrow(/wrong shape: u\.0\.2/);
    expect(() => decodeRelay(JSON.stringify({ f: 'w1', k: 'x' }))).toThrow(/wrong shape/);
  });
});

const alert = (id: number, over: Partial<AlertView> = {}): AlertView => ({
  id, unitId: `U-${id}`, depot: 'North yard', kind: 'interruptedPurge', status: 'open', raisedAt: '2026-12-01T17:04:00.120Z', episodeId: 500 + id,
  secondsIntoPurge: 38, ambientC: -14, minAmbientAfterC: null, freezeExposure: 'frozen', escalatedAt: null, acknowledgedAt: null,
  acknowledgedBy: null, resolvedAt: null, resolvedBy: null, comment: null, ...over,
});

describe('relayed alerts', () => {
  it('go in the order they were published, as the live feed carries them, under the payload limit', () => {
    const acked = alert(1, { status: 'acknowledged', acknowledgedAt: '2026-12-01T17:05:00.000Z', acknowledgedBy: 'monitor@test.local', comment: 'Driver called back' });
    const [p] = encodeAlerts('w2#0a1b2c3d', [alert(1), alert(2, { kind: 'undeterminedCold', secondsIntoPurge: null, freezeExposure: null }), acked]);
    expect(decodeRelay(p)).toEqual({ from: 'w2#0a1b2c3d', kind: 'alerts', alerts: [alert(1), alert(2, { kind: 'undeterminedCold', secondsIntoPurge: null, freezeExposure: null }), acked], refs: [] });
    // A depot-wide contact loss: 400 alerts with long comments in four-byte characters cross in several notifications.
    const many = Array.from({ length: 400 }, (_, i) => alert(i + 1, { kind: 'contactLost', comment: `Checked ${'\u{1F50B}'.repeat(120)}` }));
    const payloads = encodeAlerts('w2#0a1b2c3d', many);
    expect(payloads.length).toBeGreaterThan(10);
    // PostgreSQL documentation (NOTIFY): the payload must be shorter than 8000 bytes by default.
    for (const q of payloads) expect(Buffer.byteLength(q, 'utf8')).toBeLessThanOrEqual(MAX_PAYLOAD_BYTES);
    expect(payloads.map(decodeRelay).flatMap((m) => (m.kind === 'alerts' ? m.alerts : []))).toEqual(many);
    expect(encodeAlerts('w1#00000000', [])).toEqual([]);
  });

  it('an alert too large for a notification (a long comment) goes by its id, the others beside it whole', () => {
    // A comment of 2000 characters (the API's limit), each four bytes in UTF-8, or control characters JSON writes in six.
    const long = alert(7, { status: 'acknowledged', comment: '\u{1F50B}'.repeat(2000) });
    const escaped = alert(8, { comment: '\u0001'.repeat(2000) });
    const payloads = encodeAlerts('w1#00000000', [alert(6), long, escaped, alert(9)]);
    for (const q of payloads) expect(Buffer.byteLength(q, 'utf8')).toBeLessThanOrEqual(MAX_PAYLOAD_BYTES);
    expect(payloads.map(decodeRelay)).toEqual([{ from: 'w1#00000000', kind: 'alerts', alerts: [alert(6), alert(9)], refs: [7, 8] }]);
  });

  it('an alert only moves forward: open, escalated, acknowledged, resolved', () => {
    const esc = '2026-12-01T17:20:00.000Z';
    const stages = [
      alertStage({ status: 'open', escalatedAt: null }),
      alertStage({ status: 'open', escalatedAt: esc }),
      alertStage({ status: 'acknowledged', escalatedAt: esc }),
      alertStage({ status: 'resolved', escalatedAt: esc }),
    ];
    expect([...stages].sort((a, b) => a - b)).toEqual(stages);
    expect(new Set(stages).size).toBe(4);
    expect(alertStage({ status: 'acknowledged', escalatedAt: null })).toBeGreaterThan(alertStage({ status: 'open', escalatedAt: esc }));
    expect(alertStage({ status: 'resolved', escalatedAt: null })).toBeGreaterThan(alertStage({ status: 'acknowledged', escalatedAt: esc }));
  });

  it('a relayed alert that is not a live-feed alert is refused with its reason', () => {
    expect(() => decodeRelay(JSON.stringify({ f: 'w1', k: 'al', a: [{ ...alert(1), status: 'closed' }], r: [] }))).toThrow(/wrong shape/);
    expect(() => decodeRelay(JSON.stringify({ f: 'w1', k: 'al', a: [], r: [0] }))).toThrow(/wrong shape/);
    expect(() => decodeRelay(JSON.stringify({ f: 'w1', k: 'al', a: [] }))).toThrow(/wrong shape/);
  });
});
