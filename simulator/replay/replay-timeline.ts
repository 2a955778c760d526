import { MAX_FRAMES_PER_MESSAGE } from '../../shared/protocol/limits';
import { uplinkTopic } from '../../shared/protocol/topics';
import type { TimelineEntry } from '../scenario/timeline';
import type { ReplayLine } from './replay-input';

export interface ReplayOptions {
  gatewayId: string;
  firstBoot: number;
  /** Frames are batched into one `can` message for at most this long (ms). */
  batchMs?: number;
}

/**
 * Turns recorded frames and readings into one gateway's timeline: a boot record first, then the
 * readings and `can` batches (at most 200 frames, flushed after `batchMs` or before a reading) with
 * boot and seq as the protocol numbers them. Pure.
 */
export function replayTimeline(lines: readonly ReplayLine[], o: ReplayOptions): { timeline: TimelineEntry[]; nextBoot: number } {
  const sorted = [...lines].sort((a, b) => a.t - b.t); // stable: same-time lines keep file order
  const batchMs = o.batchMs ?? 1000;
  const gw = o.gatewayId;
  const out: TimelineEntry[] = [];
  if (sorted.length === 0) return { timeline: out, nextBoot: o.firstBoot };
  let boot = o.firstBoot;
  let seq = 0;
  let batch: { t: number; id: string; data: string }[] = [];
  const iso = (t: number) => new Date(t).toISOString();
  const publish = (t: number, kind: 'telemetry' | 'can' | 'power', body: Record<string, unknown>) => {
    out.push({ kind: 'publish', gatewayId: gw, sendAt: t, topic: uplinkTopic(gw, kind), payload: { boot, seq: seq++, ts: iso(t), ...body } });
  };
  const flush = () => {
    if (batch.length === 0) return;
    const last = batch[batch.length - 1].t;
    publish(last, 'can', { frames: batch.map((f) => ({ t: iso(f.t), id: f.id, data: f.data })) });
    batch = [];
  };
  const startBoot = (t: number, supplyV: number, prevShutdown: unknown) => {
    out.push({ kind: 'connect', gatewayId: gw, sendAt: t, boot });
    out.push({ kind: 'publish', gatewayId: gw, sendAt: t, topic: uplinkTopic(gw, 'status'), payload: { state: 'online', boot } });
    publish(t, 'power', { event: 'boot', supplyV, prevShutdown: prevShutdown ?? null });
  };
  const first = sorted[0];
  const firstIsBoot = first.kind === 'power' && first.body.event === 'boot';
  if (!firstIsBoot) {
    const reading = sorted.find((l): l is Exclude<ReplayLine, { kind: 'frame' }> => l.kind !== 'frame');
    startBoot(first.t, reading ? reading.body.supplyV : 0, null);
  }
  let started = !firstIsBoot;
  for (const l of sorted) {
    if (l.kind === 'frame') {
      if (batch.length > 0 && l.t - batch[0].t > batchMs) flush();
      batch.push({ t: l.t, id: l.id, data: l.data });
      if (batch.length >= MAX_FRAMES_PER_MESSAGE) flush();
      continue;
    }
    flush();
    if (l.kind === 'power' && l.body.event === 'boot') {
      if (started) {
        out.push({ kind: 'disconnect', gatewayId: gw, sendAt: l.t });
        boot++;
        seq = 0;
      }
      started = true;
      startBoot(l.t, l.body.supplyV, l.body.prevShutdown);
      continue;
    }
    const { ts: _ts, ...body } = l.body as Record<string, unknown>;
    publish(l.t, l.kind, body);
  }
  flush();
  return { timeline: out, nextBoot: boot + 1 };
}
