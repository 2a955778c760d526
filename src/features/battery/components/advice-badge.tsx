import type { BatterySummary } from '../../../../shared/api/battery';

const TONE: Record<BatterySummary['advice'], string> = {
  safeOverWeekend: 'border-state-safe/60 bg-state-safe/10 text-state-safe',
  drainTooHigh: 'border-danger/60 bg-danger/10 text-danger',
  notEnoughData: 'border-line bg-raised text-muted',
};
const MARK: Record<BatterySummary['advice'], string> = { safeOverWeekend: '✓', drainTooHigh: '!', notEnoughData: '?' };

export function AdviceBadge({ s }: { s: Pick<BatterySummary, 'advice' | 'adviceText'> }) {
  return (
    <span className={`inline-flex items-center gap-2 rounded-md border px-2 py-1 text-sm font-medium ${TONE[s.advice]}`}>
      <span aria-hidden="true" className="font-bold">{MARK[s.advice]}</span>
      {s.adviceText}
    </span>
  );
}
