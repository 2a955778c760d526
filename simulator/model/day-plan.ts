import { createRng, type Rng } from '../core/rng';
import { HOUR, MINUTE, SECOND, dayStart, weekdayOf } from '../core/time';
import type { UnitSpec } from './fleet-types';

export type IsolationHow = 'hasty' | 'afterSafe';

export interface PlannedIsolation {
  how: IsolationHow;
  openAt: number;
  /** The switch was put back this many ms after opening (the supply came back): `supply-restored`. */
  bounceMs: number | null;
  /** After a bounce, the driver opens it again properly at this time (or never). */
  reopenAt: number | null;
}

export interface Cycle {
  on: number;
  off: number;
  /** How long before `on` the driver closes the isolator, if it is open. */
  leadMs: number;
  endOfShift: boolean;
  isolation: PlannedIsolation | null;
  /** A gateway watchdog reset in the middle of this drive, or null. */
  watchdogAt: number | null;
}

export interface PlanOptions {
  seed: string;
  /** Multiplies drive lengths (the demo uses shorter legs so purges come often). */
  driveScale: number;
}

function worksOn(opts: PlanOptions, unit: UnitSpec, day: number): boolean {
  if (!unit.shift.days.includes(weekdayOf(day))) return false;
  return !createRng(`${opts.seed}/off/${unit.id}/${day}`).chance(0.03);
}

function shiftStartOf(opts: PlanOptions, unit: UnitSpec, day: number): number {
  const r = createRng(`${opts.seed}/start/${unit.id}/${day}`);
  return dayStart(day) + unit.shift.startHour * HOUR + r.normal(0, 12 * MINUTE);
}

/** Start of the next shift after `day` (looks a week ahead), or null. */
export function nextShiftStart(opts: PlanOptions, unit: UnitSpec, day: number): number | null {
  for (let d = day + 1; d <= day + 8; d++) if (worksOn(opts, unit, d)) return shiftStartOf(opts, unit, d);
  return null;
}

/** Keeps a key-off from ending right at the purge's end, where "resumed" and "completed" would be a coin toss. */
function clampStop(unit: UnitSpec, ms: number): number {
  const lo = (unit.purgeSeconds - unit.ecmEarlyS - 6) * SECOND;
  const hi = (unit.purgeSeconds + 6) * SECOND;
  return ms > lo && ms < hi ? hi + (ms - lo) : ms;
}

function hastyOpenAt(rng: Rng, unit: UnitSpec, off: number): number {
  const latest = Math.max(4, unit.purgeSeconds - unit.ecmEarlyS - 8);
  return off + Math.min(latest, 3 + rng.exp(15)) * SECOND;
}

function afterSafeAt(rng: Rng, unit: UnitSpec, off: number): number {
  return off + (unit.purgeSeconds + 5 + Math.min(1800, rng.exp(150))) * SECOND;
}

function endIsolation(rng: Rng, unit: UnitSpec, off: number, longBreak: boolean): PlannedIsolation | null {
  const weekendP = longBreak ? 1 : 0;
  const habit = unit.driver.habit;
  if (habit === 'hasty' && rng.chance(0.75)) {
    const openAt = hastyOpenAt(rng, unit, off);
    const bounce = rng.chance(0.06);
    return {
      how: 'hasty', openAt,
      bounceMs: bounce ? rng.int(300, 1500) : null,
      reopenAt: bounce && rng.chance(0.5) ? afterSafeAt(rng, unit, off) : null,
    };
  }
  const p = habit === 'never' ? 0.35 * weekendP : 0.55 + 0.4 * weekendP;
  return rng.chance(p) ? { how: 'afterSafe', openAt: afterSafeAt(rng, unit, off), bounceMs: null, reopenAt: null } : null;
}

/** One unit's working day: key-on/key-off cycles and what the driver does with the isolator. Pure in (seed, unit, day). */
export function planDay(opts: PlanOptions, unit: UnitSpec, day: number): Cycle[] {
  if (!worksOn(opts, unit, day)) return [];
  const rng = createRng(`${opts.seed}/day/${unit.id}/${day}`);
  const start = shiftStartOf(opts, unit, day);
  const end = start + unit.shift.lengthH * HOUR;
  const next = nextShiftStart(opts, unit, day);
  // "More isolate before a weekend": a break of over 30 h until the next shift.
  const longBreak = next === null || next - end > 30 * HOUR;
  const cycles: Cycle[] = [];
  let on = start;
  let leadMs = rng.int(2, 10) * MINUTE;
  while (cycles.length < 40) {
    const drive = Math.max(4 * MINUTE, rng.float(20, 100) * MINUTE * opts.driveScale);
    let off = on + drive;
    const last = off >= end - 15 * MINUTE;
    if (last) off = Math.max(off, end);
    const watchdogAt = rng.chance(0.01) && off - on > 10 * MINUTE ? on + rng.float(3 * MINUTE, off - on - 3 * MINUTE) : null;
    if (last) {
      cycles.push({ on, off, leadMs, endOfShift: true, isolation: endIsolation(rng, unit, off, longBreak), watchdogAt });
      break;
    }
    const r = rng.next();
    const stopMs = clampStop(unit, r < 0.3 ? rng.float(15, 100) * SECOND : r < 0.8 ? rng.float(3, 25) * MINUTE : rng.float(30, 45) * MINUTE);
    const isolation = stopMs > 30 * MINUTE && unit.driver.habit === 'hasty' && rng.chance(0.15)
      ? { how: 'hasty' as const, openAt: hastyOpenAt(rng, unit, off), bounceMs: null, reopenAt: null }
      : null;
    cycles.push({ on, off, leadMs, endOfShift: false, isolation, watchdogAt });
    on = off + stopMs;
    leadMs = rng.int(20, 60) * SECOND;
  }
  return cycles;
}
