import { DataTable, type Column } from '../../../components/ui/data-table';
import { formatDateTime } from '../../../lib/format';
import type { SortState } from '../../../lib/sort';
import type { HistoryFaultRow } from '../../../../shared/api/history-query';

const COLUMNS: Column<HistoryFaultRow>[] = [
  { key: 'at', header: 'At', sortable: true, cell: (r) => formatDateTime(r.at) },
  { key: 'unitId', header: 'Unit', sortable: true, cell: (r) => <span title={r.unitName}>{r.unitId}</span> },
  { key: 'depot', header: 'Depot', sortable: true, cell: (r) => r.depot },
  { key: 'driver', header: 'Driver', sortable: true, cell: (r) => r.driverName ?? <span className="text-muted">—</span> },
  { key: 'spn', header: 'SPN', sortable: true, align: 'right', cell: (r) => r.spn },
  { key: 'fmi', header: 'FMI', sortable: true, align: 'right', cell: (r) => <span title={r.fmiText}>{r.fmi}</span> },
  { key: 'fmiText', header: 'Failure mode', cell: (r) => r.fmiText },
  { key: 'episode', header: 'After an interruption', cell: (r) => (r.episodeId === null ? 'No' : <span className="font-semibold text-caution">Yes (episode {r.episodeId})</span>) },
];

export function FaultHistoryTable({ rows, sort, onSortChange }: { rows: HistoryFaultRow[]; sort: SortState; onSortChange: (key: string) => void }) {
  return <DataTable caption="Faults" columns={COLUMNS} rows={rows} rowKey={(r) => String(r.id)} sort={sort} onSortChange={onSortChange} empty="No faults match these filters." />;
}
