import { createRng, type Rng } from '../core/rng';
import { MINUTE, SECOND, dayIndexOf } from '../core/time';
import type { Gap } from '../model/coverage';
import { newBattery, type BatteryState } from '../model/electrical';
import type { FrameT } from './unit-types';
import type { GatewayAssignment, UnitSpec } from '../model/fleet-types';
import type { FaultTruth, KeyOffTruth } from '../truth/truth-schema';
import { Dm1Bus } from './dm1-bus';
import { EventQueue } from './event-queue';
import { Outbox } from './outbox';
import { finalizeKeyOff, recordSettles, type OpenPurge } from './purge-record';
import { readAmbient, readSupply } from './readings';
import type { SimContext, SimEvent } from './sim-context';
import { handleEvent } from './unit-events';
import { planDayInto } from './unit-planning';

const WARM_UP_MS = 36 * 60 * MINUTE;
const AWAKE_PERIOD_MS = 5 * SECOND; // protocol: every 5 s while key on or ECM awake
const ASLEEP_PERIOD_MS = 15 * MINUTE; // protocol: every 15 min while parked and asleep
const MAX_FRAMES = 200; // protocol: at most 200 frames per can message

/** One truck with its gateway, simulated event by event. Deterministic in (seed, unit, assignment). */
export class UnitSim {
  readonly rng: Rng;
  readonly queue = new EventQueue<SimEvent>();
  readonly outbox: Outbox;
  readonly bus: Dm1Bus;
  t: number;
  keyOn = false;
  ecmAwake = false;
  ecmToken = 0;
  parkToken = 0;
  isolatorOpen = false;
  gw: 'off' | 'on' | 'sleep' = 'off';
  gapDepth = 0;
  battery: BatteryState;
  lastShutdown: { ts: string; cause: 'supply-lost' | 'sleep' | 'watchdog' | 'unknown' } | null = null;
  purge: OpenPurge | null = null;
  /** keyOffAt of an interrupted purge whose consequences show at the next key-on. */
  pendingAfterInterrupt: { keyOffAt: string } | null = null;
  lastAmbientC: number | null = null;
  ending = false;
  keyOffs: OpenPurge[] = [];
  faults: FaultTruth[] = [];
  gaps: Gap[] = [];
  private nextSampleAt = Infinity;
  private nextDm1At = Infinity;
  private canBatch: FrameT[] = [];
  private plannedThrough: number;

  constructor(readonly ctx: SimContext, readonly unit: UnitSpec, readonly assignment: GatewayAssignment) {
    this.rng = createRng(`${ctx.seed}/unit/${unit.id}`);
    this.bus = new Dm1Bus(this.rng.fork('dm1'));
    const clockRef = ctx.start;
    this.outbox = new Outbox({
      gatewayId: assignment.gatewayId,
      firstBoot: assignment.firstBoot,
      clock: (t) => t + unit.clockOffsetMs + ((t - clockRef) * unit.clockPpm) / 1e6,
      rng: this.rng.fork('outbox'),
      duplicateP: ctx.duplicateP,
    });
    this.battery = newBattery(this.rng.float(12.45, 12.7));
    this.t = ctx.start - WARM_UP_MS;
    this.plannedThrough = dayIndexOf(this.t) - 1;
    this.queue.push({ at: ctx.start, type: 'start' });
  }

  /** Simulates up to (not including) `until`. */
  advance(until: number): void {
    for (;;) {
      this.plan(this.t);
      const ev = this.queue.peekAt();
      const sample = this.gw === 'on' ? this.nextSampleAt : Infinity;
      const dm1 = this.gw === 'on' && this.keyOn && this.bus.hasActive ? this.nextDm1At : Infinity;
      const next = Math.min(ev, sample, dm1);
      if (next >= until) break;
      this.t = Math.max(this.t, next);
      if (ev === next) handleEvent(this, this.queue.shift()!);
      else if (dm1 === next) this.dm1Tick();
      else this.sample();
    }
    this.t = Math.max(this.t, until);
  }

  /** The end of a run: an open purge plays out (nothing new starts), then the gateway's last resends go. */
  finish(): void {
    this.ending = true;
    const p = this.purge;
    if (p && (!p.physicalDone || p.evidenceOpen)) this.advance(Math.max(this.t, p.cTrue) + 2 * MINUTE);
    this.outbox.finish(this.t);
  }

  private plan(t: number): void {
    const horizon = dayIndexOf(t) + 2;
    while (this.plannedThrough < horizon) planDayInto(this.ctx, this.unit, ++this.plannedThrough, this.queue, this.gaps);
  }

  /** A telemetry sample now (also on any change of key). */
  sample(): void {
    if (this.gw !== 'on') return;
    const t = this.t;
    this.flushCan(t);
    const supplyV = readSupply(this.rng, this.unit, this.battery, this.keyOn, this.isolatorOpen, t);
    const ambientC = readAmbient(this.rng, this.unit, this.ctx.weather, t);
    const body: Record<string, unknown> = { key: this.keyOn ? 'on' : 'off', supplyV };
    if (ambientC !== undefined) body.ambientC = ambientC;
    this.lastAmbientC = ambientC ?? null;
    body.ecmAwake = this.ecmAwake;
    const p = this.purge;
    let evidence;
    if (p && p.evidenceOpen && p.boot === this.outbox.boot) {
      if (this.keyOn || this.outbox.clockMs(t) >= p.cTs || !this.ecmAwake) {
        evidence = p.evidence;
        p.evidenceOpen = false;
      }
    }
    this.outbox.publish(t, 'telemetry', body, evidence);
    const period = this.keyOn || this.ecmAwake ? AWAKE_PERIOD_MS : ASLEEP_PERIOD_MS;
    this.nextSampleAt = t + period + this.rng.int(-15, 15);
  }

  /** The gateway powers up: `boot` with how the previous boot ended, then a first sample. */
  bootUp(): void {
    if (this.isolatorOpen) return;
    const t = this.t;
    this.gw = 'on';
    this.outbox.powerUp(t);
    const prevShutdown = this.lastShutdown;
    this.lastShutdown = null;
    const p = this.purge;
    let evidence;
    if (p && p.evidenceOpen) {
      // Protocol rule 3: only the next boot's record counts.
      if (this.outbox.boot === p.boot + 1 && recordSettles(prevShutdown, p.cTs)) evidence = p.evidence;
      p.evidenceOpen = false;
    }
    const supplyV = readSupply(this.rng, this.unit, this.battery, this.keyOn, false, t);
    this.outbox.publish(t, 'power', { event: 'boot', supplyV, prevShutdown }, evidence);
    this.sample();
  }

  /** The gateway stops (supply gone, watchdog, deep sleep): unsent frames are lost with it. */
  shutDown(cause: 'supply-lost' | 'sleep' | 'watchdog' | 'unknown' | null): void {
    this.lastShutdown = cause === null ? null : { ts: this.outbox.ts(this.t), cause };
    this.canBatch = [];
    this.gw = this.gw === 'on' && cause === 'sleep' ? 'sleep' : 'off';
    this.outbox.powerDown(this.t);
    this.nextSampleAt = Infinity;
  }

  captureFrames(frames: readonly FrameT[]): void {
    if (this.gw !== 'on') return;
    this.canBatch.push(...frames);
    if (this.canBatch.length >= MAX_FRAMES) this.flushCan(this.t);
  }

  /** Batches the captured frames (at most 200 a message) into `can` messages. */
  flushCan(t: number): void {
    const ready = this.canBatch.filter((f) => f.t <= t);
    if (ready.length === 0) return;
    this.canBatch = this.canBatch.filter((f) => f.t > t);
    for (let i = 0; i < ready.length; i += MAX_FRAMES) {
      const frames = ready.slice(i, i + MAX_FRAMES).map((f) => ({ t: this.outbox.ts(f.t), id: f.id, data: f.data }));
      this.outbox.publish(t, 'can', { frames });
    }
  }

  startDm1(): void {
    this.nextDm1At = this.t;
  }

  private dm1Tick(): void {
    const { frames, announced } = this.bus.tick(this.t);
    this.captureFrames(frames);
    for (const a of announced) {
      const d = a.dtc;
      this.faults.push({ unitId: this.unit.id, at: this.outbox.ts(a.at), sourceAddress: d.sa, spn: d.spn, fmi: d.fmi, occurrenceCount: d.occurrenceCount, linkedKeyOffAt: d.linkedKeyOffAt });
    }
    this.nextDm1At = this.t + SECOND;
  }

  /** A run without end keeps only recent history: drops what was settled before `t` (true time). */
  forgetBefore(t: number): void {
    this.keyOffs = this.keyOffs.filter((p) => p === this.purge || Date.parse(p.truth.trueKeyOffAt) >= t);
    this.faults = this.faults.filter((f) => Date.parse(f.at) >= t);
    this.gaps = this.gaps.filter((g) => g.to >= t);
  }

  keyOffTruths(): KeyOffTruth[] {
    return this.keyOffs.map(finalizeKeyOff);
  }
}
