import type { UnitSpec } from '../model/fleet-types';
import type { Truth } from '../truth/truth-schema';
import { FleetSim, type FleetSimOptions } from './fleet-sim';
import type { TimelineEntry } from './timeline';

export interface Generated {
  fleet: UnitSpec[];
  timeline: TimelineEntry[];
  truth: Truth;
  /** Boot counter for each unit's gateway at its next power-up (to persist between runs). */
  nextBoots: Map<string, number>;
}

/** The pure generator: the same options give the same timeline and truth, entry for entry. */
export function generateScenario(opts: FleetSimOptions): Generated {
  const sim = new FleetSim(opts);
  const timeline = sim.finish();
  return { fleet: sim.fleet, timeline, truth: sim.truth(), nextBoots: sim.nextBoots() };
}
