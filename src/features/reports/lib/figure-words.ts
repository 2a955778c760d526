export const pct = (share: number | null) => (share === null ? '—' : `${(share * 100).toFixed(0)} %`);
export const secs = (s: number | null) => (s === null ? '—' : `${s.toFixed(0)} s`);
