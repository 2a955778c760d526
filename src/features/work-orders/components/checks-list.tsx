import { formatDateTime } from '../../../lib/format';
import type { CheckView } from '../../../../shared/api/work-orders';
import { CHECK_WORDS, VERDICT_WORDS } from '../lib/words';

const tone = (v: CheckView['verdict']) => (v === 'pass' ? 'text-state-safe border-state-safe/50' : 'text-danger border-danger/50');

export function ChecksList({ checks }: { checks: CheckView[] }) {
  if (!checks.length) return <p className="text-muted">No checks recorded yet.</p>;
  return (
    <ul className="flex flex-col gap-2" aria-label="Recorded checks">
      {checks.map((c) => (
        <li key={c.key} className="rounded-md border border-line bg-raised px-4 py-3">
          <div className="flex flex-wrap items-center justify-between gap-2">
            <span className="font-medium">{CHECK_WORDS[c.key]}</span>
            <span className={`rounded border px-2 py-0.5 text-sm font-semibold ${tone(c.verdict)}`}>{VERDICT_WORDS[c.verdict]}</span>
          </div>
          {c.ohms !== null && (
            <p className="mt-1 font-mono">
              {c.ohms} Ω{c.band && <span className="text-muted"> · expected {c.band.minOhms}–{c.band.maxOhms} Ω at {c.systemVoltage} V ({c.band.source})</span>}
            </p>
          )}
          {c.note && <p className="mt-1 text-sm">{c.note}</p>}
          <p className="mt-1 text-sm text-muted">{c.recordedBy ?? 'unknown'} · {formatDateTime(c.recordedAt)}</p>
        </li>
      ))}
    </ul>
  );
}
