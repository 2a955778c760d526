import { mkdtemp, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { faultActivationsFromFrames } from '../../shared/j1939/dm1-tracker';
import { CanSchema, PowerSchema, TelemetrySchema } from '../../shared/protocol/messages';
import { createRng } from '../../simulator/core/rng';
import { dm1Frames, SA_AFTERTREATMENT } from '../../simulator/model/faults';
import { readCandump, readTelemetryLines } from '../../simulator/replay/replay-input';
import { replayTimeline } from '../../simulator/replay/replay-timeline';

let dir: string;
const t0 = Date.parse('2026-11-27T17:00:00.000Z');
const dtc = (spn: number) => ({ sa: SA_AFTERTREATMENT, spn, fmi: 7, occurrenceCount: 1, linkedKeyOffAt: null, announced: false });

beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), 'aw-replay-'));
  const rng = createRng('replay');
  const lines: string[] = [];
  // 300 DM1 single frames 2 ms apart (more than one batch of 200), then one BAM with three DTCs.
  for (let i = 0; i < 300; i++) {
    const f = dm1Frames(rng, t0 + i * 2, SA_AFTERTREATMENT, [dtc(520310)])[0];
    lines.push(`(${Math.floor(f.t / 1000)}.${String((f.t % 1000) * 1000 + 123).padStart(6, '0')}) can0 ${f.id}#${f.data}`);
  }
  for (const f of dm1Frames(rng, t0 + 10_000, SA_AFTERTREATMENT, [dtc(520310), dtc(520311), dtc(520312)])) {
    lines.push(`(${(f.t / 1000).toFixed(6)}) can0 ${f.id}#${f.data}`);
  }
  await writeFile(join(dir, 'bus.log'), `${lines.join('\n')}\n`);
  await writeFile(join(dir, 'gw.jsonl'), [
    JSON.stringify({ ts: '2026-11-27T16:59:59.000Z', key: 'on', supplyV: 28.3, ambientC: -3, ecmAwake: true }),
    JSON.stringify({ ts: '2026-11-27T17:00:05.000Z', key: 'off', supplyV: 25.9, ecmAwake: true }),
    JSON.stringify({ ts: '2026-11-27T17:00:31.500Z', event: 'supply-lost', supplyV: 2.1 }),
    JSON.stringify({ ts: '2026-11-28T06:00:00.000Z', event: 'boot', supplyV: 25.1, prevShutdown: { ts: '2026-11-27T17:00:31.500Z', cause: 'supply-lost' } }),
  ].join('\n'));
  await writeFile(join(dir, 'bad.log'), '(1700000000.123456) can0 18FECA00#0400\nnot a frame\n');
});
afterAll(() => rm(dir, { recursive: true, force: true }));

describe('replaying a recorded candump -L log and readings through one gateway', () => {
  it('numbers boot and seq as the protocol says and batches at most 200 frames a message', async () => {
    const lines = [...(await readCandump(join(dir, 'bus.log'))), ...(await readTelemetryLines(join(dir, 'gw.jsonl')))];
    const { timeline, nextBoot } = replayTimeline(lines, { gatewayId: 'REPLAY-1', firstBoot: 7 });
    const pubs = timeline.flatMap((e) => (e.kind === 'publish' && !e.topic.endsWith('/status') ? [e] : []));
    const schema = { telemetry: TelemetrySchema, can: CanSchema, power: PowerSchema } as const;
    for (const p of pubs) expect(schema[p.topic.split('/').pop() as keyof typeof schema].safeParse(p.payload).success).toBe(true);
    const counters = pubs.map((p) => [p.payload.boot, p.payload.seq]);
    const firstBootCount = counters.filter(([b]) => b === 7).length;
    expect(counters.slice(0, firstBootCount)).toEqual(Array.from({ length: firstBootCount }, (_, i) => [7, i]));
    expect(counters.slice(firstBootCount)).toEqual([[8, 0]]);
    expect(nextBoot).toBe(9);
    expect(pubs[0].payload).toMatchObject({ event: 'boot', prevShutdown: null });
    const cans = pubs.filter((p) => p.topic.endsWith('/can'));
    expect(Math.max(...cans.map((c) => (c.payload.frames as unknown[]).length))).toBe(200);
    const frames = cans.flatMap((c) => c.payload.frames as { t: string; id: string; data: string }[]);
    expect(frames).toHaveLength(303) // 300 single frames + TP.CM + 2 TP.DT (14 bytes);
    // Microseconds are cut to the protocol's milliseconds.
    expect(frames[1].t).toBe('2026-11-27T17:00:00.002Z');
    const { activations } = faultActivationsFromFrames(frames.map((f) => ({ ...f, t: Date.parse(f.t) })));
    expect(activations.map((a) => a.spn)).toEqual([520310, 520311, 520312]);
    expect(timeline.filter((e) => e.kind === 'connect').length).toBe(2);
  });

  it('refuses a log with lines that are not frames, saying which line', async () => {
    await expect(readCandump(join(dir, 'bad.log'))).rejects.toThrow(/line 2/);
  });

  it('refuses a readings line that does not follow the protocol, saying which line and field', async () => {
    await writeFile(join(dir, 'bad.jsonl'), '{"ts":"2026-11-27T17:00:05Z","key":"off","supplyV":25.9,"ecmAwake":true}\n');
    await expect(readTelemetryLines(join(dir, 'bad.jsonl'))).rejects.toThrow(/line 1: ts/);
  });
});
