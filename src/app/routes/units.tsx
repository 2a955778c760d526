import { CautionNote } from '../../components/ui/caution-note';
import { ErrorNotice } from '../../components/ui/error-notice';
import { Loading } from '../../components/ui/loading';
import { PageHeader } from '../../components/ui/page-header';
import { nextSort } from '../../lib/sort';
import { liveStatus } from '../../lib/live-feed';
import { useStore } from '../../lib/live-store';
import { useUnits } from '../../features/units/api/get-units';
import { StateSummary } from '../../features/units/components/state-summary';
import { UnitsFilters } from '../../features/units/components/units-filters';
import { UnitsTable } from '../../features/units/components/units-table';
import { countStates } from '../../features/units/lib/count-states';
import { depotsOf, filterAndSortUnits } from '../../features/units/lib/filter-units';
import { useUnitFilters } from '../../features/units/lib/use-unit-filters';

export function UnitsPage() {
  // The live feed writes into the same cache; poll only while it is down.
  const units = useUnits({ refetchInterval: useStore(liveStatus) === 'live' ? false : 10_000 });
  const { filters, update: setFilters } = useUnitFilters();

  const all = units.data ?? [];
  // Recomputed only when the list or the address changes; the table's 1 s clock lives below this page.
  const depots = depotsOf(all);
  const shown = filterAndSortUnits(all, filters);

  return (
    <>
      <PageHeader
        title="Units"
        description="Every unit's purge state and gateway, kept current by the live feed."
        actions={
          units.data && (
            <p className="self-center text-muted" aria-live="polite">
              {shown.length === all.length ? `${all.length} units` : `${shown.length} of ${all.length} units`}
            </p>
          )
        }
      />
      {units.data && (
        <StateSummary
          counts={countStates(filters.depot ? all.filter((u) => u.depot === filters.depot) : all)}
          selected={filters.state}
          onSelect={(state) => setFilters({ state })}
        />
      )}
      <UnitsFilters filters={filters} depots={depots} onChange={setFilters} />
      {units.isPending && <Loading label="Loading units…" />}
      {units.isError && <ErrorNotice title="Could not load the units" error={units.error} />}
      {units.data && (
        <>
          {units.isRefetchError && <ErrorNotice title="Refreshing failed; showing the last list received" error={units.error} />}
          <UnitsTable
            units={shown}
            fetchedAt={units.dataUpdatedAt}
            sort={filters.sort}
            onSortChange={(key) => setFilters((f) => ({ ...f, sort: nextSort(f.sort, key) }))}
          />
        </>
      )}
      <CautionNote className="mt-8" />
    </>
  );
}
