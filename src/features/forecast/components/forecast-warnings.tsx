import { formatCelsius, formatDateTime } from '../../../lib/format';
import type { ForecastWarning } from '../api/depots';

/** Parked units with an unfinished purge where the forecast reaches the DEF freezing point: act before `actBy`. */
export function ForecastWarnings({ warnings }: { warnings: ForecastWarning[] }) {
  if (!warnings.length) return <p className="text-muted">No parked unit with an unfinished purge faces a freezing forecast.</p>;
  return (
    <ul className="flex flex-col gap-2" aria-label="Forecast warnings">
      {warnings.map((w) => (
        <li key={w.alertId} className="rounded-md border border-danger/50 bg-danger/10 px-4 py-3">
          <span className="font-mono font-semibold">{w.unitId}</span> at {w.depot}: run a full purge before <strong>{formatDateTime(w.actBy)}</strong> (low {formatCelsius(w.lowC)} at {formatDateTime(w.lowAt)}).
        </li>
      ))}
    </ul>
  );
}
