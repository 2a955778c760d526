import { createRng } from '../core/rng';
import { SECOND, iso } from '../core/time';
import { mergeGaps } from '../model/coverage';
import { buildFleet } from '../model/fleet';
import type { GatewayAssignment, UnitSpec } from '../model/fleet-types';
import { createWeather } from '../model/weather';
import { UnitSim } from '../gateway/unit-sim';
import type { SimContext } from '../gateway/sim-context';
import type { Truth } from '../truth/truth-schema';
import { SCENARIOS, type ScenarioName } from './scenarios';
import { mergeTimelines, type TimelineEntry } from './timeline';

export interface FleetSimOptions {
  scenario: ScenarioName;
  units?: number;
  seed: string;
  /** Overrides the scenario's start (epoch ms); the demo starts at this (default: required for the demo). */
  start?: number;
  /** Gateway id and first boot per unit id; default `<unit>-gw1` with a seeded boot counter. */
  gateways?: ReadonlyMap<string, GatewayAssignment>;
}

export function defaultAssignment(seed: string, unitId: string): GatewayAssignment {
  return { gatewayId: `${unitId}-gw1`, firstBoot: createRng(`${seed}/boot/${unitId}`).int(1, 400) };
}

/** The whole fleet, advanced step by step (the demo) or to the end at once (the scenarios). */
export class FleetSim {
  readonly fleet: UnitSpec[];
  readonly sims: UnitSim[];
  readonly ctx: SimContext;

  constructor(readonly opts: FleetSimOptions) {
    const def = SCENARIOS[opts.scenario];
    const start = opts.start ?? (def.start === null ? null : Date.parse(def.start));
    if (start === null) throw new Error(`scenario ${opts.scenario} needs a start time`);
    const startMs = Math.floor(start / SECOND) * SECOND;
    const seed = opts.seed;
    this.ctx = {
      seed,
      plan: { seed, driveScale: def.driveScale },
      coverage: { seed, ...def.coverage },
      weather: createWeather({ seed, ...def.weather }),
      start: startMs,
      end: def.durationMs === null ? null : startMs + def.durationMs,
      duplicateP: def.duplicateP,
      otherFaultP: def.otherFaultP,
    };
    this.fleet = buildFleet({ units: opts.units ?? def.defaultUnits, seed, roundTheClock: def.roundTheClock });
    this.sims = this.fleet.map((u) => new UnitSim(this.ctx, u, opts.gateways?.get(u.id) ?? defaultAssignment(seed, u.id)));
  }

  /** Simulates up to `until` and returns the entries made since the last call, in send order. */
  advance(until: number): TimelineEntry[] {
    for (const s of this.sims) s.advance(until);
    return this.take();
  }

  /** Runs every unit to the end of the scenario, lets open purges play out, and returns the rest. */
  finish(): TimelineEntry[] {
    if (this.ctx.end === null) throw new Error('a run without end cannot finish');
    for (const s of this.sims) {
      s.advance(this.ctx.end);
      s.finish();
    }
    return this.take();
  }

  private take(): TimelineEntry[] {
    return mergeTimelines(this.sims.map((s) => s.outbox.takeEntries()));
  }

  forgetBefore(t: number): void {
    for (const s of this.sims) s.forgetBefore(t);
  }

  /** The boot counter each gateway will use at its next power-up. */
  nextBoots(): Map<string, number> {
    return new Map(this.sims.map((s) => [s.unit.id, (s.outbox.lastBoot ?? s.assignment.firstBoot - 1) + 1]));
  }

  truth(end?: number): Truth {
    const keyOffs = this.sims.flatMap((s) => s.keyOffTruths());
    const linkable = new Set(keyOffs.filter((k) => k.expectedOutcome === 'interrupted').map((k) => `${k.unitId}/${k.keyOffAt}`));
    const faults = this.sims.flatMap((s) => s.faults).map((f) => ({
      ...f,
      linkedKeyOffAt: f.linkedKeyOffAt !== null && linkable.has(`${f.unitId}/${f.linkedKeyOffAt}`) ? f.linkedKeyOffAt : null,
    }));
    const until = end ?? this.ctx.end ?? Math.max(...this.sims.map((s) => s.t));
    return {
      version: 1,
      scenario: this.opts.scenario,
      seed: this.opts.seed,
      start: iso(this.ctx.start),
      end: iso(until),
      fleet: this.sims.map((s) => ({
        unitId: s.unit.id, gatewayId: s.outbox.gatewayId, name: s.unit.name, depot: s.unit.depot,
        systemVoltage: s.unit.systemVoltage, purgeSeconds: s.unit.purgeSeconds, driverHabit: s.unit.driver.habit,
      })),
      keyOffs,
      faults,
      coverageGaps: this.sims.flatMap((s) =>
        mergeGaps(s.gaps, this.ctx.start, until).map((g) => ({ unitId: s.unit.id, gatewayId: s.outbox.gatewayId, from: iso(g.from), to: iso(g.to) })),
      ),
    };
  }
}
