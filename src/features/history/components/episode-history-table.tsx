import { DataTable, type Column } from '../../../components/ui/data-table';
import { formatCelsius, formatDateTime } from '../../../lib/format';
import { freezeWords } from '../../../lib/freeze-words';
import type { SortState } from '../../../lib/sort';
import type { HistoryEpisodeRow } from '../../../../shared/api/history-query';
import { outcomeWords } from '../lib/words';

const COLUMNS: Column<HistoryEpisodeRow>[] = [
  { key: 'keyOffAt', header: 'Key-off', sortable: true, cell: (r) => formatDateTime(r.keyOffAt) },
  { key: 'unitId', header: 'Unit', sortable: true, cell: (r) => <span title={r.unitName}>{r.unitId}</span> },
  { key: 'depot', header: 'Depot', sortable: true, cell: (r) => r.depot },
  { key: 'driver', header: 'Driver', sortable: true, cell: (r) => r.driverName ?? <span className="text-muted">—</span> },
  {
    key: 'outcome', header: 'Outcome', sortable: true,
    cell: (r) => <span className={r.outcome === 'interrupted' ? 'font-semibold text-danger' : ''}>{outcomeWords(r.outcome)}</span>,
  },
  { key: 'secondsIntoPurge', header: 'Into purge', sortable: true, align: 'right', cell: (r) => (r.secondsIntoPurge === null ? '—' : `${r.secondsIntoPurge.toFixed(0)} of ${r.purgeSeconds} s`) },
  { key: 'ambientC', header: 'Ambient', sortable: true, align: 'right', cell: (r) => formatCelsius(r.ambientC) },
  { key: 'freezeExposure', header: 'Freeze exposure', sortable: true, cell: (r) => (r.outcome === 'interrupted' ? freezeWords(r.freezeExposure) : '—') },
  { key: 'faults', header: 'Linked faults', align: 'right', cell: (r) => r.faultCount },
];

export function EpisodeHistoryTable({ rows, sort, onSortChange }: { rows: HistoryEpisodeRow[]; sort?: SortState; onSortChange?: (key: string) => void }) {
  return <DataTable caption="Key-off purge episodes" columns={COLUMNS} rows={rows} rowKey={(r) => String(r.id)} sort={sort} onSortChange={onSortChange} empty="No episodes match these filters." />;
}
