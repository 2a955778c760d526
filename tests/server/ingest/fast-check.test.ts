// The plain checks of the hot path against the protocol's zod schemas (zod, from the registry, is the
// reference): wherever the plain checks accept a payload, zod accepts it too and gives the same value, key
// order included (it is what the raw history stores). Payloads are valid ones mutated field by field with
// edge and hostile values, from a seeded generator so that a failure can be replayed.
import { describe, expect, it } from 'vitest';
import { CanSchema, PowerSchema, TelemetrySchema } from '../../../shared/protocol/messages';
import { fastCan, fastPower, fastTelemetry } from '../../../server/ingest/fast-check';
import { parseMessage } from '../../../server/ingest/parse-message';
import { rng } from '../../helpers/rng';

const MISSING = Symbol('missing');
const TS = '2026-11-27T17:02:11.250Z';
// Edge values for any field: numbers at and past the protocol's bounds, unsafe integers, -0, strings that
// look like numbers or dates, impossible dates, a leap day (valid in 2024, not in 2026), wrong types.
const EDGES: unknown[] = [
  MISSING, null, true, false, 0, -0, 1, -1, 0.5, 12.61, -11, 99.9, 100, 100.0001, -100, -100.5, 999.99, 1000, 1000.5, -1000, -1000.01,
  1e308, -1e308, 2 ** 53 - 1, 2 ** 53, 2 ** 53 + 2, 1e21, '12.6', '', 'on', 'off', 'ON', 'supply-lost', 'boot', 'sleep', 'aliens',
  TS, '2026-11-27T17:02:11.25Z', '2026-11-27T17:02:11Z', '2026-11-27 17:02:11.250Z', '2026-02-29T00:00:00.000Z', '2024-02-29T00:00:00.000Z',
  '2026-13-01T00:00:00.000Z', '2100-02-29T00:00:00.000Z', '2000-02-29T00:00:00.000Z', '2026-04-31T00:00:00.000Z', '2026-12-31T23:59:59.999Z',
  '2026-11-27T17:02:60.000Z', '2026-00-10T00:00:00.000Z', '2026-11-00T00:00:00.000Z', '0000-01-01T00:00:00.000Z', '0099-12-31T23:59:59.999Z',
  '2026-11-27T17:02:11.2a0Z', '2026-11-27T17:02:11.250Zx', '２026-11-27T17:02:11.250Z', '-2026-11-27T17:02:11.250Z', '2026-11-27T24:00:00.000Z', '2026-11-27T17:60:00.000Z', '+02026-11-27T17:02:11.250Z', '2026-11-27T17:02:11.250z',
  '18FECA00', '18feca00', '18FECA0', 'XYZ12345', '0400640001010000', '04006400010100000000', '0', 'ab', [], [1], {}, { ts: TS, cause: 'sleep' },
  { ts: TS, cause: 'sleep', extra: 1 }, { ts: 'never', cause: 'sleep' }, { ts: TS }, [{ ts: TS, cause: 'sleep' }],
];

const validTelemetry = () => ({ boot: 12, seq: 4031, ts: TS, key: 'off', supplyV: 12.61, ambientC: -8.5, ecmAwake: true, fw: 'x' });
const validPower = () => ({ boot: 13, seq: 0, ts: TS, event: 'boot', supplyV: 12.44, prevShutdown: { ts: '2026-11-27T17:03:02.020Z', cause: 'supply-lost' } });
const validFrame = () => ({ t: TS, id: '18FECA00', data: '0400640001010000' });
const validCan = () => ({ boot: 12, seq: 4032, ts: TS, frames: [validFrame(), validFrame()] });

function mutate(r: () => number, base: Record<string, unknown>, fields: string[]) {
  const out: Record<string, unknown> = { ...base };
  const n = Math.floor(r() * 3);
  for (let i = 0; i < n; i++) {
    const f = fields[Math.floor(r() * fields.length)];
    const v = EDGES[Math.floor(r() * EDGES.length)];
    if (v === MISSING) delete out[f];
    else out[f] = v;
  }
  return out;
}

type Check = (m: Record<string, unknown>) => unknown;
function agree(fast: Check, schema: { safeParse(v: unknown): { success: boolean; data?: unknown } }, payload: Record<string, unknown>) {
  const quick = fast(payload);
  if (quick === null) return schema.safeParse(payload).success ? 'valid, left to zod' : 'left to zod';
  const ref = schema.safeParse(payload);
  expect(ref.success, `zod refuses what the plain checks accepted: ${JSON.stringify(payload)}`).toBe(true);
  expect(JSON.stringify(quick)).toBe(JSON.stringify(ref.data));
  return 'accepted';
}

describe('plain checks agree with the protocol schemas', () => {
  it('accept the protocol document\'s own examples, as zod does', () => {
    // The examples of gateway-protocol.md (telemetry, can, power twice).
    expect(agree(fastTelemetry, TelemetrySchema, { boot: 12, seq: 4031, ts: '2026-11-27T17:02:11.250Z', key: 'off', supplyV: 12.61, ambientC: -8.5, ecmAwake: true })).toBe('accepted');
    expect(agree(fastCan, CanSchema, { boot: 12, seq: 4032, ts: '2026-11-27T17:02:11.300Z', frames: [{ t: '2026-11-27T17:02:11.101Z', id: '18FECA00', data: '0400640001010000' }] })).toBe('accepted');
    expect(agree(fastPower, PowerSchema, { boot: 12, seq: 4040, ts: '2026-11-27T17:03:02.020Z', event: 'supply-lost', supplyV: 2.4 })).toBe('accepted');
    expect(agree(fastPower, PowerSchema, { boot: 13, seq: 0, ts: '2026-11-30T06:41:10.000Z', event: 'boot', supplyV: 12.44, prevShutdown: { ts: '2026-11-27T17:03:02.020Z', cause: 'supply-lost' } })).toBe('accepted');
  });

  it('accept exactly what zod accepts, over 60,000 mutated payloads of each kind', () => {
    const r = rng(20261202);
    const tally = { accepted: 0, 'left to zod': 0, 'valid, left to zod': 0 };
    for (let i = 0; i < 60_000; i++) {
      tally[agree(fastTelemetry, TelemetrySchema, mutate(r, validTelemetry(), ['boot', 'seq', 'ts', 'key', 'supplyV', 'ambientC', 'ecmAwake']))]++;
      tally[agree(fastPower, PowerSchema, mutate(r, validPower(), ['boot', 'seq', 'ts', 'event', 'supplyV', 'prevShutdown']))]++;
      const can = mutate(r, validCan(), ['boot', 'seq', 'ts', 'frames']);
      if (Array.isArray(can.frames) && r() < 0.5) can.frames = [validFrame(), mutate(r, validFrame(), ['t', 'id', 'data'])];
      tally[agree(fastCan, CanSchema, can)]++;
    }
    // Both paths were exercised: the mutations keep many payloads valid and make many invalid.
    expect(tally.accepted).toBeGreaterThan(40_000);
    expect(tally['left to zod']).toBeGreaterThan(40_000);
    // And they are not merely cautious: every payload zod accepts, they accept too.
    expect(tally['valid, left to zod']).toBe(0);
  });

  it('leave a refusal to zod, so its reason reads as before', () => {
    const bad = parseMessage('telemetry', Buffer.from(JSON.stringify({ ...validTelemetry(), supplyV: '12.6' })));
    expect(bad).toEqual({ ok: false, reason: expect.stringMatching(/^invalid telemetry: supplyV: /) });
    const frames = Array.from({ length: 201 }, validFrame);
    expect(parseMessage('can', Buffer.from(JSON.stringify({ ...validCan(), frames })))).toEqual({ ok: false, reason: expect.stringMatching(/^invalid can: frames: /) });
  });
});
