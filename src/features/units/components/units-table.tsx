import { DataTable, type Column } from '../../../components/ui/data-table';
import { formatCelsius, formatVolts } from '../../../lib/format';
import type { SortState } from '../../../lib/sort';
import type { UnitSortKey } from '../lib/filter-units';
import type { Unit } from '../types';
import { TimeInStateCell, UnitStateCell } from './unit-time-cells';

export interface UnitsTableProps {
  units: Unit[];
  /** When the list was fetched (TanStack Query's dataUpdatedAt), for the countdown. */
  fetchedAt: number;
  sort: SortState<UnitSortKey>;
  onSortChange: (key: UnitSortKey) => void;
}

export function UnitsTable({ units, fetchedAt, sort, onSortChange }: UnitsTableProps) {
  const mono = 'font-mono tabular-nums';
  const columns: Column<Unit>[] = [
    { key: 'id', header: 'Unit', sortable: true, cell: (u) => <span className={`${mono} font-medium`}>{u.id}</span> },
    { key: 'name', header: 'Name', sortable: true, cell: (u) => u.name },
    { key: 'depot', header: 'Depot', sortable: true, cell: (u) => u.depot },
    {
      key: 'state',
      header: 'State',
      sortable: true,
      cell: (u) => <UnitStateCell unit={u} fetchedAt={u.receivedAt ?? fetchedAt} />,
    },
    {
      key: 'timeInState',
      header: 'In state',
      sortable: true,
      cell: (u) => <TimeInStateCell unit={u} />,
    },
    { key: 'lastSupplyV', header: 'Supply', sortable: true, align: 'right', cell: (u) => <span className={mono}>{formatVolts(u.lastSupplyV)}</span> },
    { key: 'lastAmbientC', header: 'Ambient', sortable: true, align: 'right', cell: (u) => <span className={mono}>{formatCelsius(u.lastAmbientC)}</span> },
    { key: 'systemVoltage', header: 'System', sortable: true, align: 'right', cell: (u) => <span className={mono}>{u.systemVoltage} V</span> },
    { key: 'purgeSeconds', header: 'Purge', sortable: true, align: 'right', cell: (u) => <span className={mono}>{u.purgeSeconds} s</span> },
    {
      key: 'gatewayId',
      header: 'Gateway',
      sortable: true,
      cell: (u) => (u.gatewayId ? <span className={mono}>{u.gatewayId}</span> : <span className="text-muted">none</span>),
    },
  ];
  return (
    <DataTable
      caption="Units"
      columns={columns}
      rows={units}
      rowKey={(u) => u.id}
      sort={sort}
      onSortChange={(key) => onSortChange(key as UnitSortKey)}
      empty="No units match these filters."
    />
  );
}
