import { useMemo } from 'react';
import { Link } from 'react-router-dom';
import { CautionNote } from '../../components/ui/caution-note';
import { ErrorNotice } from '../../components/ui/error-notice';
import { Loading } from '../../components/ui/loading';
import { PageHeader } from '../../components/ui/page-header';
import { bannerAlerts, liveStatus } from '../../lib/live-feed';
import { useStore } from '../../lib/live-store';
import { useSession } from '../../lib/session';
import { nextSort } from '../../lib/sort';
import { useAlerts } from '../../features/alerts/api/get-alerts';
import { AlertBanner, AlertSoundToggle } from '../../features/alerts/components/alert-banner';
import { useUnits } from '../../features/units/api/get-units';
import { BoardTable } from '../../features/units/components/board-table';
import { StateSummary } from '../../features/units/components/state-summary';
import { UnitsFilters } from '../../features/units/components/units-filters';
import { countStates } from '../../features/units/lib/count-states';
import { depotsOf, filterAndSortUnits } from '../../features/units/lib/filter-units';
import { useUnitFilters } from '../../features/units/lib/use-unit-filters';

export function BoardPage() {
  const live = useStore(liveStatus) === 'live';
  // While the feed is live it writes every change into this cache; poll only when it is down.
  const units = useUnits({ refetchInterval: live ? false : 10_000 });
  const alerts = useStore(bannerAlerts);
  // Every open alert, also those raised before this page was opened (the banner only takes new ones).
  const openAlerts = useAlerts({ status: 'open' });
  const role = useSession()?.user.role;
  const { filters, key: filterKey, update: setFilters } = useUnitFilters();

  const all = units.data;
  const depots = useMemo(() => depotsOf(all ?? []), [all]);
  // `filters` is read from the address, so the address string stands for it here.
  const shown = useMemo(() => filterAndSortUnits(all ?? [], filters), [all, filterKey]);
  const counts = useMemo(() => countStates(filters.depot ? (all ?? []).filter((u) => u.depot === filters.depot) : (all ?? [])), [all, filters.depot]);
  const names = useMemo(() => new Map((all ?? []).map((u) => [u.id, u.name])), [all]);

  return (
    <>
      <AlertBanner alerts={alerts} canAct={role === 'admin' || role === 'monitor'} unitName={(id) => names.get(id)} />
      <PageHeader
        title="Board"
        description="Every unit's purge state as it happens. Choose a state to show only those units."
        actions={
          <div className="flex items-center gap-6 self-center">
            <AlertSoundToggle />
            {openAlerts.data && openAlerts.data.length > 0 && (
              <Link to="/alerts" className="inline-flex items-center gap-2 text-lg font-semibold text-state-interrupted hover:underline">
                <svg viewBox="0 0 20 20" aria-hidden="true" className="h-5 w-5">
                  <path d="M10 2 19 18H1z" fill="currentColor" />
                </svg>
                {openAlerts.data.length} open alert{openAlerts.data.length === 1 ? '' : 's'}
              </Link>
            )}
            {all && (
              <p className="text-lg text-muted" aria-live="polite">
                {shown.length === all.length ? `${all.length} unit${all.length === 1 ? '' : 's'}` : `${shown.length} of ${all.length} units`}
              </p>
            )}
          </div>
        }
      />
      {all && <StateSummary counts={counts} selected={filters.state} onSelect={(state) => setFilters({ state })} />}
      <UnitsFilters filters={filters} depots={depots} onChange={setFilters} />
      {units.isPending && <Loading label="Loading units…" />}
      {units.isError && <ErrorNotice title="Could not load the units" error={units.error} />}
      {all && (
        <>
          {units.isRefetchError && <ErrorNotice title="Refreshing failed; showing the last list received" error={units.error} />}
          <BoardTable units={shown} sort={filters.sort} onSortChange={(key) => setFilters((f) => ({ ...f, sort: nextSort(f.sort, key) }))} />
        </>
      )}
      <CautionNote className="mt-8" />
    </>
  );
}
