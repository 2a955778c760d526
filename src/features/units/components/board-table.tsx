import { Link } from 'react-router-dom';
import { DataTable, type Column } from '../../../components/ui/data-table';
import { StateBadge } from '../../../components/ui/state-badge';
import { formatCelsius, formatCountdown, formatDuration, formatVolts } from '../../../lib/format';
import type { SortState } from '../../../lib/sort';
import { timeInState } from '../../../lib/time-in-state';
import { useNow } from '../../../lib/use-now';
import type { UnitSortKey } from '../lib/filter-units';
import { remainingSeconds } from '../lib/purge-countdown';
import type { Unit } from '../types';

/** The state in large type; while purging, the countdown ticks from the value received with the unit. */
function BoardState({ unit }: { unit: Unit }) {
  if (unit.state !== 'purging') return <StateBadge state={unit.state} size="lg" />;
  return <PurgeCountdownBadge unit={unit} />;
}

function PurgeCountdownBadge({ unit }: { unit: Unit }) {
  const left = remainingSeconds(unit.purgeRemainingS, unit.receivedAt ?? Date.now(), useNow());
  return <StateBadge state="purging" size="lg" detail={left !== null ? `${formatCountdown(left)} left` : undefined} />;
}

function BoardTimeInState({ unit }: { unit: Unit }) {
  const t = timeInState(unit, useNow());
  if (!t) return <span className="text-muted">—</span>;
  return (
    <span className="font-mono text-lg tabular-nums" title={t.byUnitClock ? "Past data: measured to the unit's latest message, not to this browser's clock" : undefined}>
      {formatDuration(t.ms)}
      {t.byUnitClock && <span className="ml-1.5 font-sans text-sm text-muted">(unit clock)</span>}
    </span>
  );
}

export interface BoardTableProps {
  units: Unit[];
  sort: SortState<UnitSortKey>;
  onSortChange: (key: UnitSortKey) => void;
}

/** Every unit at a glance, for a wall screen: large state, live countdown, the last readings. */
export function BoardTable({ units, sort, onSortChange }: BoardTableProps) {
  const mono = 'font-mono text-lg tabular-nums';
  const columns: Column<Unit>[] = [
    {
      key: 'id',
      header: 'Unit',
      sortable: true,
      cell: (u) => (
        <Link to={`/units/${encodeURIComponent(u.id)}`} className="block leading-tight hover:underline">
          <span className="block font-mono text-lg font-semibold text-fg">{u.id}</span>
          <span className="block text-sm text-muted">{u.name}</span>
        </Link>
      ),
    },
    { key: 'state', header: 'State', sortable: true, cell: (u) => <BoardState unit={u} /> },
    { key: 'timeInState', header: 'In state', sortable: true, cell: (u) => <BoardTimeInState unit={u} /> },
    { key: 'depot', header: 'Depot', sortable: true, cell: (u) => <span className="text-lg">{u.depot}</span> },
    { key: 'systemVoltage', header: 'System', sortable: true, align: 'right', cell: (u) => <span className={mono}>{u.systemVoltage} V</span> },
    { key: 'lastSupplyV', header: 'Supply', sortable: true, align: 'right', cell: (u) => <span className={mono}>{formatVolts(u.lastSupplyV)}</span> },
    { key: 'lastAmbientC', header: 'Ambient', sortable: true, align: 'right', cell: (u) => <span className={mono}>{formatCelsius(u.lastAmbientC)}</span> },
  ];
  return (
    <DataTable
      caption="Fleet board"
      columns={columns}
      rows={units}
      rowKey={(u) => u.id}
      sort={sort}
      onSortChange={(key) => onSortChange(key as UnitSortKey)}
      rowClassName={(u) => (u.state === 'interrupted' ? 'bg-state-interrupted/8' : '')}
      empty="No units match these filters."
    />
  );
}
