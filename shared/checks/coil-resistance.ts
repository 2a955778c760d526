// Judging a relay coil by its resistance between terminals 85 and 86 (the coil terminals in the
// DIN 72552 numbering, from memory), measured with the relay out of its socket.
//
// The bands are common practice, no published source: a healthy automotive relay coil reads about
// 30–130 Ω on a 12 V system and 200–400 Ω on a 24 V system. Under the band suggests shorted turns
// (the coil draws too much and may not hold); over it, a corroded, broken or open coil. The relay
// manufacturer's data sheet, where there is one, prevails over these bands.

export const COIL_RESISTANCE_BANDS = {
  12: { minOhms: 30, maxOhms: 130 },
  24: { minOhms: 200, maxOhms: 400 },
} as const satisfies Record<12 | 24, { minOhms: number; maxOhms: number }>;

export const COIL_BAND_SOURCE = 'common practice, no published source';

/** A meter's open-circuit reading is shown as "OL"; anything this high is an open coil for our purpose. */
export const MAX_RECORDED_OHMS = 1_000_000;

export type CoilVerdict = 'low' | 'pass' | 'high';

export interface CoilJudgement {
  verdict: CoilVerdict;
  minOhms: number;
  maxOhms: number;
  systemVoltage: 12 | 24;
}

/** Both band ends count as in the band. Throws on a value that is not a measured resistance. */
export function judgeCoilResistance(ohms: number, systemVoltage: 12 | 24): CoilJudgement {
  if (!Number.isFinite(ohms) || ohms < 0 || ohms > MAX_RECORDED_OHMS) {
    throw new RangeError(`coil resistance must be a finite number of ohms from 0 to ${MAX_RECORDED_OHMS}, got ${ohms}`);
  }
  const band = COIL_RESISTANCE_BANDS[systemVoltage];
  if (!band) throw new RangeError(`system voltage must be 12 or 24, got ${String(systemVoltage)}`);
  const verdict: CoilVerdict = ohms < band.minOhms ? 'low' : ohms > band.maxOhms ? 'high' : 'pass';
  return { verdict, minOhms: band.minOhms, maxOhms: band.maxOhms, systemVoltage };
}
