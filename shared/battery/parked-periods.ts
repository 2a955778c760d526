// Parked periods with the isolator closed, cut from a unit's ordered telemetry and power events. Pure, no I/O.
import type { VoltageReading } from './drain';

export type SupplySample =
  | { ts: number; kind: 'telemetry'; key: 'on' | 'off'; supplyV: number }
  | { ts: number; kind: 'power'; event: 'supply-lost' | 'supply-restored' | 'boot' };

export interface ParkedPeriod {
  /** The key-off that ended charging (the alternator stops with the engine). */
  chargeStoppedAt: number;
  /** The last reading of the period. */
  lastAt: number;
  /** Why the period ended; 'open' while the unit is still parked at the last reading. */
  endedBy: 'keyOn' | 'supplyLost' | 'boot' | 'gap' | 'open';
  readings: VoltageReading[];
}

/**
 * More than this without a reading means the record has a hole (the protocol sends every 15 min
 * while parked), so the period ends rather than fitting a line across it (a design choice).
 */
export const MAX_GAP_MS = 2 * 3_600_000;

/**
 * A period starts at a key-off seen after a key-on (so the time charging stopped is known) and
 * lasts while the key stays off and the supply stays at or above the unit's loss threshold.
 */
export function parkedPeriods(samples: readonly SupplySample[], lossThresholdV: number): ParkedPeriod[] {
  const out: ParkedPeriod[] = [];
  let current: ParkedPeriod | null = null;
  let lastKey: 'on' | 'off' | null = null;
  const close = (endedBy: ParkedPeriod['endedBy']) => {
    if (current) out.push({ ...current, endedBy });
    current = null;
  };
  for (const s of samples) {
    if (current && s.ts - current.lastAt > MAX_GAP_MS) close('gap');
    if (s.kind === 'power') {
      if (s.event === 'supply-lost') close('supplyLost');
      if (s.event === 'boot') close('boot');
      if (s.event !== 'supply-restored') lastKey = null;
      continue;
    }
    if (s.key === 'on') {
      close('keyOn');
      lastKey = 'on';
      continue;
    }
    if (s.supplyV < lossThresholdV) {
      close('supplyLost');
      lastKey = null;
      continue;
    }
    if (!current && lastKey === 'on') current = { chargeStoppedAt: s.ts, lastAt: s.ts, endedBy: 'open', readings: [] };
    if (current) {
      current.readings.push({ ts: s.ts, volts: s.supplyV });
      current.lastAt = s.ts;
    }
    lastKey = 'off';
  }
  close('open');
  return out;
}
