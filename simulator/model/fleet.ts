import { createRng, type Rng } from '../core/rng';
import type { DriverHabit, Shift, UnitSpec } from './fleet-types';

// An invented fleet. Depot names, unit names and driver call signs are made up for the demo.
export const DEPOTS = ['Harrowgate Yard', 'Linmoor Depot', 'Quayside Cross'] as const;
const BODIES = ['Tractor', 'Rigid', 'Tipper', 'Reefer', 'Curtainsider', 'Tanker', 'Dropside'] as const;

export interface FleetOptions {
  units: number;
  seed: string;
  /** Demo: shifts spread around the clock and seven days, so the board always moves. */
  roundTheClock?: boolean;
}

function pickHabit(rng: Rng): DriverHabit {
  const r = rng.next();
  return r < 0.7 ? 'waits' : r < 0.85 ? 'hasty' : 'never';
}

function pickShift(rng: Rng, roundTheClock: boolean): Shift {
  const weekdays = [1, 2, 3, 4, 5];
  if (roundTheClock) {
    const startHour = rng.pick([4, 6, 8, 11, 14, 17, 20, 22]) + rng.float(0, 1);
    return { startHour, lengthH: rng.float(7, 10), days: [0, 1, 2, 3, 4, 5, 6] };
  }
  const r = rng.next();
  if (r < 0.6) return { startHour: rng.float(5, 8), lengthH: rng.float(8, 10), days: weekdays };
  if (r < 0.85) return { startHour: rng.float(11, 14), lengthH: rng.float(7, 9), days: weekdays };
  if (r < 0.95) return { startHour: rng.float(5, 7), lengthH: rng.float(8, 9.5), days: [...weekdays, 6] };
  return { startHour: rng.float(20, 22), lengthH: rng.float(7, 9), days: [0, 1, 2, 3, 4] };
}

export function unitIdOf(index: number): string {
  return `TRK-${101 + index}`;
}

export function buildFleet(opts: FleetOptions): UnitSpec[] {
  const units: UnitSpec[] = [];
  for (let index = 0; index < opts.units; index++) {
    const rng = createRng(`${opts.seed}/fleet/${index}`);
    const systemVoltage: 12 | 24 = rng.chance(0.4) ? 12 : 24;
    const id = unitIdOf(index);
    units.push({
      index,
      id,
      name: `${rng.pick(BODIES)} ${101 + index}`,
      depot: DEPOTS[index % DEPOTS.length],
      systemVoltage,
      // Most profiles keep the common two-minute wait; some controllers are configured longer.
      purgeSeconds: rng.pick([120, 120, 120, 120, 90, 150, 180, 240]),
      driver: { id: `DRV-${String(index + 1).padStart(3, '0')}`, habit: pickHabit(rng) },
      shift: pickShift(rng, opts.roundTheClock ?? false),
      sagVPerH: rng.float(0.0015, 0.0065),
      ecmEarlyS: rng.chance(0.2) ? rng.int(12, 25) : 0,
      hasAmbientSensor: !rng.chance(0.06),
      lossMissP: rng.chance(0.15) ? 0.3 : 0.04,
      gatewaySleepAfterH: rng.chance(0.3) ? rng.float(3, 8) : null,
      clockOffsetMs: Math.round(rng.float(-3500, 3500)),
      clockPpm: rng.float(-25, 25),
    });
  }
  return units;
}
