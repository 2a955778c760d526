/** The ranges a unit's page offers. Bounds are taken when a query runs, so a refetch sees new data. */
export const RANGES = {
  '24h': { label: '24 h', ms: 24 * 3600_000 },
  '72h': { label: '72 h', ms: 72 * 3600_000 },
  '7d': { label: '7 d', ms: 7 * 24 * 3600_000 },
} as const;
export type RangeKey = keyof typeof RANGES;

export function isRangeKey(v: string | null): v is RangeKey {
  return v !== null && v in RANGES;
}

/** The last `range` up to a minute past now (the server's own default end, for clock skew). */
export function rangeBounds(range: RangeKey, now = Date.now()) {
  const to = now + 60_000;
  return { from: new Date(to - RANGES[range].ms).toISOString(), to: new Date(to).toISOString() };
}
