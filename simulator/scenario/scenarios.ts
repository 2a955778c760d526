import { z } from 'zod';
import { HOUR } from '../core/time';

export const ScenarioNameSchema = z.enum(['weekday', 'weekend', 'cold-snap', 'coverage-gaps', 'demo']);
export type ScenarioName = z.infer<typeof ScenarioNameSchema>;

export interface ScenarioDef {
  name: ScenarioName;
  summary: string;
  defaultUnits: number;
  /** Fixed past start (so a run replays in event time), or null: start at the current time. */
  start: string | null;
  /** null: runs until stopped. */
  durationMs: number | null;
  weather: { meanC: number | null; swingC: number; capC?: number };
  coverage: { longGapP: number; shortGapP: number };
  driveScale: number;
  roundTheClock: boolean;
  duplicateP: number;
  otherFaultP: number;
}

const base = {
  defaultUnits: 20,
  weather: { meanC: 4, swingC: 4 },
  coverage: { longGapP: 0.03, shortGapP: 0.08 },
  driveScale: 1,
  roundTheClock: false,
  duplicateP: 0.004,
  otherFaultP: 0.04,
} as const;

export const SCENARIOS: Record<ScenarioName, ScenarioDef> = {
  weekday: { ...base, name: 'weekday', summary: 'one working Tuesday, 03:00 to 03:00', start: '2026-11-24T03:00:00.000Z', durationMs: 24 * HOUR },
  weekend: {
    ...base, name: 'weekend', summary: 'Friday 15:00 to Monday 08:00: many trucks isolated for the weekend',
    start: '2026-11-27T15:00:00.000Z', durationMs: (24 * 2 + 17) * HOUR, weather: { meanC: 2, swingC: 4 },
  },
  'cold-snap': {
    ...base, name: 'cold-snap', summary: 'a working Wednesday in a cold snap, ambient below -11 °C all day',
    start: '2026-12-09T03:00:00.000Z', durationMs: 24 * HOUR, weather: { meanC: -17, swingC: 3.5, capC: -13 },
  },
  'coverage-gaps': {
    ...base, name: 'coverage-gaps', summary: 'a working Tuesday with frequent loss of network coverage (store-and-forward)',
    start: '2026-11-24T03:00:00.000Z', durationMs: 24 * HOUR, coverage: { longGapP: 0.6, shortGapP: 0.5 },
  },
  demo: {
    ...base, name: 'demo', summary: 'about 40 trucks over three depots, live from now, forever',
    defaultUnits: 40, start: null, durationMs: null, weather: { meanC: null, swingC: 4 }, driveScale: 0.45, roundTheClock: true,
  },
};
