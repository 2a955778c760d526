import type { CoverageOptions } from '../model/coverage';
import type { PlanOptions } from '../model/day-plan';
import type { Weather } from '../model/weather';

/** What every unit of a run shares. Times are true epoch ms. */
export interface SimContext {
  seed: string;
  plan: PlanOptions;
  coverage: CoverageOptions;
  weather: Weather;
  /** Gateways power up at `start`; before it the trucks run silently so the fleet starts mid-life. */
  start: number;
  /** null for a run without end (the live demo). */
  end: number | null;
  duplicateP: number;
  /** Chance per drive of a fault unrelated to any purge. */
  otherFaultP: number;
}

export type SimEvent =
  | { at: number; type: 'preKeyOn' }
  | { at: number; type: 'keyOn'; off: number }
  | { at: number; type: 'keyOff'; isolation: import('../model/day-plan').PlannedIsolation | null }
  | { at: number; type: 'isoOpen'; how: 'hasty' | 'afterSafe'; bounceMs: number | null }
  | { at: number; type: 'isoBounceEnd' }
  | { at: number; type: 'ecmSleep'; token: number }
  | { at: number; type: 'gwSleep'; token: number }
  | { at: number; type: 'purgeEnd' }
  | { at: number; type: 'watchdog' }
  | { at: number; type: 'watchdogBoot' }
  | { at: number; type: 'gap'; begins: boolean }
  | { at: number; type: 'faultStart'; purge: boolean; linkedKeyOffAt: string | null; until: number }
  | { at: number; type: 'faultEnd'; dtcs: import('../model/faults').ActiveDtc[] }
  | { at: number; type: 'start' };
