/**
 * Seconds left in a purge, counted down in the browser from the server's `purgeRemainingS`
 * at the moment it was fetched, so the browser's clock and the gateway's never need to agree.
 * Rounded up, never below 0 (protocol rule 8: ceil of the seconds to C, at least 0).
 */
export function remainingSeconds(purgeRemainingS: number | null, fetchedAtMs: number, nowMs: number): number | null {
  if (purgeRemainingS === null) return null;
  const elapsed = Math.max(0, nowMs - fetchedAtMs) / 1000;
  return Math.max(0, Math.ceil(purgeRemainingS - elapsed));
}
