import { StateBadge } from '../../../components/ui/state-badge';
import { formatCountdown, formatDuration } from '../../../lib/format';
import { timeInState } from '../../../lib/time-in-state';
import { useNow } from '../../../lib/use-now';
import { remainingSeconds } from '../lib/purge-countdown';
import type { Unit } from '../types';

/** The state badge, with the purge countdown ticking in the browser while purging. */
export function UnitStateCell({ unit, fetchedAt }: { unit: Unit; fetchedAt: number }) {
  if (unit.state !== 'purging') return <StateBadge state={unit.state} />;
  return <PurgingBadge purgeRemainingS={unit.purgeRemainingS} fetchedAt={fetchedAt} />;
}

function PurgingBadge({ purgeRemainingS, fetchedAt }: { purgeRemainingS: number | null; fetchedAt: number }) {
  const left = remainingSeconds(purgeRemainingS, fetchedAt, useNow());
  return <StateBadge state="purging" detail={left !== null ? `${formatCountdown(left)} left` : undefined} />;
}

/** Time in state, on the unit's own clock for replayed past data (see lib/time-in-state.ts). */
export function TimeInStateCell({ unit }: { unit: Unit }) {
  const t = timeInState(unit, useNow());
  if (!t) return <span className="font-mono tabular-nums">—</span>;
  return (
    <span className="font-mono tabular-nums">
      {formatDuration(t.ms)}
      {t.byUnitClock && <span className="ml-1 font-sans text-sm text-muted">(unit clock)</span>}
    </span>
  );
}
