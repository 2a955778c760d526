// Gateway protocol: telemetry comes every 5 s while the key is on or the controller is awake, and
// every 15 min while parked asleep, so a powered gateway is never silent much longer than 15 min.
const REPORTING_GAP_MS = 20 * 60_000;

// States in which the gateway is expected to keep reporting. In the others (supply lost, isolated,
// no contact) silence is the normal consequence of the state itself.
const REPORTING_STATES = new Set(['keyOn', 'purging', 'safeToIsolate']);

export interface TimeInState {
  ms: number;
  /** True when measured against the unit's own last message rather than the browser's clock. */
  byUnitClock: boolean;
}

/**
 * How long a unit has been in its state. Normally the browser clock minus `stateSince`, clamped at 0
 * (clocks of the browser and the server never agree exactly).
 *
 * A replay of past data (a recorded weekend fed through the service) carries old timestamps, and the
 * server judges it in event time: its units purge and count down "now" while their `stateSince` lies
 * days back. Measured against the browser clock such a unit would read "1 d 19 h" beside a live
 * countdown. So when a unit that should be reporting has a last message further back than the
 * protocol's longest reporting gap, the time is measured on the unit's own clock instead: its last
 * message time (or, while purging, the point the countdown shows), run on since the browser received
 * it (the server's unit clock runs the same way).
 */
export function timeInState(
  u: {
    state: string | null;
    stateSince: string | null;
    lastSeenAt: string | null;
    receivedAt?: number;
    purgeSeconds?: number;
    purgeRemainingS?: number | null;
  },
  nowMs: number,
): TimeInState | null {
  const since = u.stateSince ? Date.parse(u.stateSince) : NaN;
  if (Number.isNaN(since)) return null;
  const seen = u.lastSeenAt ? Date.parse(u.lastSeenAt) : NaN;
  if (u.state && REPORTING_STATES.has(u.state) && !Number.isNaN(seen) && nowMs - seen > REPORTING_GAP_MS) {
    // While purging, the server's countdown tells exactly how far the unit's clock had run when the
    // browser received it (the purge started at stateSince); otherwise its last message is the best mark.
    let atReceipt = seen;
    if (u.state === 'purging' && u.purgeSeconds !== undefined && u.purgeRemainingS !== null && u.purgeRemainingS !== undefined) {
      atReceipt = Math.max(seen, since + (u.purgeSeconds - u.purgeRemainingS) * 1000);
    }
    const unitNow = atReceipt + Math.max(0, nowMs - (u.receivedAt ?? nowMs));
    return { ms: Math.max(0, unitNow - since), byUnitClock: true };
  }
  return { ms: Math.max(0, nowMs - since), byUnitClock: false };
}
