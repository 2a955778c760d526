import { useState } from 'react';
import { Button } from '../../components/ui/button';
import { ErrorNotice } from '../../components/ui/error-notice';
import { Loading } from '../../components/ui/loading';
import { PageHeader } from '../../components/ui/page-header';
import { useUnits } from '../../features/units/api/get-units';
import { useDrivers } from '../../features/drivers/api/get-drivers';
import { useHistoryEpisodes, useHistoryFaults } from '../../features/history/api/get-history';
import { downloadFile } from '../../features/history/api/download-csv';
import { HistoryFiltersBar } from '../../features/history/components/history-filters';
import { EpisodeHistoryTable } from '../../features/history/components/episode-history-table';
import { FaultHistoryTable } from '../../features/history/components/fault-history-table';
import { Pager } from '../../features/history/components/pager';
import { historyQuery, type HistoryView } from '../../features/history/lib/history-params';
import { useHistoryFilters } from '../../features/history/lib/use-history-filters';

function ViewTabs({ view, onView }: { view: HistoryView; onView: (v: HistoryView) => void }) {
  const tab = (v: HistoryView, label: string) => (
    <button type="button" role="tab" aria-selected={view === v} onClick={() => onView(v)}
      className={`rounded-t-md border-b-2 px-4 py-2 font-medium ${view === v ? 'border-accent text-fg' : 'border-transparent text-muted hover:text-fg'}`}>
      {label}
    </button>
  );
  return <div role="tablist" className="mb-4 flex gap-2 border-b border-line">{tab('episodes', 'Key-off episodes')}{tab('faults', 'Faults')}</div>;
}

export function HistoryPage() {
  const { filters, update } = useHistoryFilters();
  const units = useUnits();
  const drivers = useDrivers();
  const episodes = useHistoryEpisodes(filters);
  const faults = useHistoryFaults(filters);
  const current = filters.view === 'episodes' ? episodes : faults;
  const [exporting, setExporting] = useState(false);
  const [exportError, setExportError] = useState<unknown>(null);

  const unitList = units.data ?? [];
  const depots = [...new Set(unitList.map((u) => u.depot))].sort();
  const onSort = (key: string) => update({ sort: key, dir: filters.sort === key && filters.dir === 'desc' ? 'asc' : 'desc', page: 1 });
  const exportCsv = async () => {
    setExporting(true);
    setExportError(null);
    try {
      await downloadFile(`/api/history/${filters.view}/export.csv`, historyQuery(filters, false), `${filters.view}.csv`);
    } catch (err) {
      setExportError(err);
    } finally {
      setExporting(false);
    }
  };

  return (
    <>
      <PageHeader
        title="History"
        description="Key-off purges and faults across the fleet. Times are shown in your time zone; the day filters are UTC days. The export holds every row of the filter, not only this page."
        actions={<Button variant="primary" onClick={exportCsv} disabled={exporting}>{exporting ? 'Exporting…' : 'Export CSV'}</Button>}
      />
      <ViewTabs view={filters.view} onView={(view) => update({ view, sort: view === 'faults' ? 'at' : 'keyOffAt', dir: 'desc', page: 1, outcome: '', linked: '' })} />
      <HistoryFiltersBar filters={filters} depots={depots} units={unitList} drivers={drivers.data ?? []} onChange={update} />
      {exportError !== null && <ErrorNotice title="The export failed" error={exportError} />}
      {current.isPending && <Loading label="Loading history…" />}
      {current.isError && <ErrorNotice title="Could not load the history" error={current.error} />}
      {filters.view === 'episodes' && episodes.data && (
        <EpisodeHistoryTable rows={episodes.data.rows} sort={{ key: filters.sort, direction: filters.dir }} onSortChange={onSort} />
      )}
      {filters.view === 'faults' && faults.data && (
        <FaultHistoryTable rows={faults.data.rows} sort={{ key: filters.sort, direction: filters.dir }} onSortChange={onSort} />
      )}
      {current.data && (
        // The page shown is the one the rows came from, so the pager never runs ahead of the table while the next page loads.
        <Pager page={current.data.page} pageSize={current.data.pageSize} total={current.data.total} capped={current.data.totalCapped} loading={current.isPlaceholderData}
          onPage={(page) => update({ page })} onPageSize={(pageSize) => update({ pageSize, page: 1 })} />
      )}
    </>
  );
}
