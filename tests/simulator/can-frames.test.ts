import { createRequire } from 'node:module';
import { describe, expect, it } from 'vitest';
import { faultActivationsFromFrames } from '../../shared/j1939/dm1-tracker';
import { generateScenario } from '../../simulator/scenario/generate';

// Reference library from the npm registry: canboatjs decodes ISO 11783 / J1939 29-bit identifiers.
const require = createRequire(import.meta.url);
const { parseCanId } = require('@canboat/canboatjs/dist/canId') as { parseCanId: (id: number) => { pgn: number; src: number; dst: number; prio: number } };

const run = generateScenario({ scenario: 'weekday', units: 40, seed: 'frames' });
const framesOf = (gatewayId: string) =>
  run.timeline.flatMap((e) => (e.kind === 'publish' && !e.duplicate && e.gatewayId === gatewayId && e.topic.endsWith('/can') ? (e.payload.frames as { t: string; id: string; data: string }[]) : []));

describe('the simulated controllers broadcast DM1 as SAE J1939-21/-73 lay it out', () => {
  it('uses only DM1 (PGN 65226), TP.CM (60416) and TP.DT (60160) to the global address, as canboatjs reads the identifiers', () => {
    const all = run.truth.fleet.flatMap((u) => framesOf(u.gatewayId));
    expect(all.length).toBeGreaterThan(20);
    const pgns = new Set<number>();
    for (const f of all) {
      const id = parseCanId(parseInt(f.id, 16));
      pgns.add(id.pgn);
      expect([65226, 60416, 60160]).toContain(id.pgn);
      expect(id.dst).toBe(255);
      // SAE J1939-21: TP frames default to priority 7; DM1 is sent at priority 6 (SAE J1939-73, from memory).
      expect(id.prio).toBe(id.pgn === 65226 ? 6 : 7);
    }
    expect([...pgns].sort()).toEqual([60160, 60416, 65226]);
  });

  it('multi-packet DM1 go by BAM with packets 50–200 ms apart (SAE J1939-21), within the T1 of 750 ms', () => {
    for (const u of run.truth.fleet) {
      const frames = framesOf(u.gatewayId);
      frames.forEach((f, i) => {
        if (!f.id.startsWith('1CEC')) return;
        const packets = parseInt(f.data.slice(6, 8), 16);
        expect(f.data.slice(0, 2)).toBe('20'); // control byte 32 = BAM
        expect(f.data.slice(10, 16)).toBe('CAFE00'); // PGN 65226, little-endian
        for (let n = 1; n <= packets; n++) {
          const dt = frames[i + n];
          expect(dt.id.startsWith('1CEB')).toBe(true);
          expect(parseInt(dt.data.slice(0, 2), 16)).toBe(n);
          const gap = Date.parse(dt.t) - Date.parse(frames[i + n - 1].t);
          expect(gap).toBeGreaterThanOrEqual(50);
          expect(gap).toBeLessThanOrEqual(200);
        }
      });
    }
  });

  it('decodes (with the shared J1939 decoder) to exactly the faults the truth lists, at the same times', () => {
    let checked = 0;
    for (const u of run.truth.fleet) {
      const frames = framesOf(u.gatewayId).map((f) => ({ t: Date.parse(f.t), id: f.id, data: f.data }));
      const { activations, notices } = faultActivationsFromFrames(frames);
      expect(notices.filter((n) => n.kind !== 'ignored')).toEqual([]);
      const got = activations.map((a) => ({ at: new Date(a.at).toISOString(), sa: a.sourceAddress, spn: a.spn, fmi: a.fmi, oc: a.occurrenceCount }));
      const want = run.truth.faults.filter((f) => f.unitId === u.unitId).map((f) => ({ at: f.at, sa: f.sourceAddress, spn: f.spn, fmi: f.fmi, oc: f.occurrenceCount }));
      expect(got).toEqual(want);
      checked += want.length;
    }
    expect(checked).toBeGreaterThan(3);
  });

  it('links a purge fault to an interrupted purge only, at the next key-on', () => {
    const interrupted = new Set(run.truth.keyOffs.filter((k) => k.expectedOutcome === 'interrupted').map((k) => `${k.unitId}/${k.keyOffAt}`));
    const linked = run.truth.faults.filter((f) => f.linkedKeyOffAt !== null);
    expect(linked.length).toBeGreaterThan(0);
    for (const f of linked) expect(interrupted.has(`${f.unitId}/${f.linkedKeyOffAt}`)).toBe(true);
    expect(linked.every((f) => f.spn >= 520192 && f.spn <= 524287)).toBe(true); // the manufacturer range: invented codes
  });
});
