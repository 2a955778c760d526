// The relay between workers: what goes into each PostgreSQL notification, and what comes back out.
import { describe, expect, it } from 'vitest';
import { MAX_PAYLOAD_BYTES, decodeRelay, encodeAsk, encodeRelay, type RelayedUnit } from '../../../server/realtime/peer-wire';

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
    expect(back.flatMap((m) => (m.kind === 'ask' ? [] : m.units))).toEqual(units);
    expect(back.flatMap((m) => (m.kind === 'ask' ? [] : m.episodes))).toEqual(episodes);
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
