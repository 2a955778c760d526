import { StateBadge } from '../../../components/ui/state-badge';
import { formatCountdown, formatDuration } from '../../../lib/format';
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

export function TimeInStateCell({ since }: { since: string | null }) {
  const now = useNow();
  const t = since ? Date.parse(since) : NaN;
  return <span className="font-mono tabular-nums">{Number.isNaN(t) ? '—' : formatDuration(now - t)}</span>;
}
