import type { ReportFigures } from '../../../../shared/api/reports';
import { pct, secs } from '../lib/figure-words';

function Tile({ label, value, tone }: { label: string; value: string | number; tone?: 'danger' | 'caution' }) {
  const colour = tone === 'danger' ? 'text-danger' : tone === 'caution' ? 'text-caution' : 'text-fg';
  return (
    <div className="rounded-lg border border-line bg-panel px-4 py-3">
      <p className="text-sm text-muted">{label}</p>
      <p className={`text-2xl font-semibold tabular-nums ${colour}`}>{value}</p>
    </div>
  );
}

export function ReportTotals({ f }: { f: ReportFigures }) {
  return (
    <div className="mb-6 grid grid-cols-2 gap-3 md:grid-cols-3 xl:grid-cols-6">
      <Tile label="Key-offs" value={f.keyOffs} />
      <Tile label="Interrupted purges" value={f.interrupted} tone={f.interrupted ? 'danger' : undefined} />
      <Tile label="Share interrupted" value={pct(f.shareInterrupted)} />
      <Tile label="Median seconds into the purge" value={secs(f.medianSecondsIntoPurge)} />
      <Tile label="Freeze exposures" value={f.freezeExposures} tone={f.freezeExposures ? 'caution' : undefined} />
      <Tile label="Faults explained by interruptions" value={f.faultsExplained} />
    </div>
  );
}
