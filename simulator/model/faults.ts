import { encodeBam } from '../../shared/j1939/transport';
import { PGN_DM1, encodeDm1, type LampState } from '../../shared/j1939/dm1';
import { encodeCanId } from '../../shared/j1939/can-id';
import { bytesToHex } from '../../shared/j1939/hex';
import type { Rng } from '../core/rng';

// Invented diagnostic trouble codes for the simulated fleet. All SPNs are taken from the range
// SAE J1939 leaves to manufacturers (520192–524287, from memory), so none is a real fault number.
export const SA_ENGINE = 0x00; // SAE J1939 preferred address 0: engine #1 (from memory)
export const SA_AFTERTREATMENT = 0x3d; // preferred address 61: exhaust emission controller (from memory)
export const SA_TRANSMISSION = 0x03; // preferred address 3: transmission #1 (from memory)

/** Codes the simulated aftertreatment controller raises after an interrupted purge (DEF left in the lines). */
export const PURGE_FAULTS = [
  { spn: 520310, fmi: 7 }, // invented: DEF line did not empty
  { spn: 520311, fmi: 2 }, // invented: DEF line pressure implausible at start
  { spn: 520312, fmi: 14 }, // invented: DEF dosing restart check
] as const;

/** Codes with nothing to do with the purge. */
export const OTHER_FAULTS = [
  { sa: SA_ENGINE, spn: 520500, fmi: 3 },
  { sa: SA_ENGINE, spn: 520501, fmi: 4 },
  { sa: SA_ENGINE, spn: 520502, fmi: 15 },
  { sa: SA_TRANSMISSION, spn: 520610, fmi: 2 },
  { sa: SA_TRANSMISSION, spn: 520611, fmi: 9 },
] as const;

export interface ActiveDtc {
  sa: number;
  spn: number;
  fmi: number;
  occurrenceCount: number;
  /** keyOffAt of the interrupted purge this code follows from, or null. */
  linkedKeyOffAt: string | null;
  announced: boolean;
}

export interface Frame {
  /** capture time, true ms */
  t: number;
  id: string;
  data: string;
}

/**
 * The frames of one DM1 broadcast by `sa` listing `dtcs` (none: the "no active DTC" entry).
 * Up to one DTC fits a single frame; more go by BAM (TP.CM_BAM then TP.DT packets 50–200 ms
 * apart, SAE J1939-21). The last frame completes the message.
 */
export function dm1Frames(rng: Rng, t: number, sa: number, dtcs: readonly ActiveDtc[]): Frame[] {
  const amber: LampState = dtcs.length > 0 ? 'on' : 'off';
  const data = encodeDm1({
    lamps: { mil: 'off', redStop: 'off', amberWarning: amber, protect: 'off' },
    dtcs: dtcs.map((d) => ({ spn: d.spn, fmi: d.fmi, occurrenceCount: d.occurrenceCount })),
  });
  if (data.length <= 8) {
    return [{ t, id: encodeCanId({ priority: 6, pgn: PGN_DM1, sourceAddress: sa }), data: bytesToHex(data) }];
  }
  let at = t;
  return encodeBam({ pgn: PGN_DM1, sourceAddress: sa, data }).map((f, i) => {
    if (i > 0) at += rng.float(55, 150);
    return { t: at, id: f.id, data: f.data };
  });
}
