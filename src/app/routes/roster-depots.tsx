import { Button } from '../../components/ui/button';
import { CautionNote } from '../../components/ui/caution-note';
import { ErrorNotice } from '../../components/ui/error-notice';
import { Loading } from '../../components/ui/loading';
import { PageHeader } from '../../components/ui/page-header';
import { Panel } from '../../components/ui/panel';
import { useSession } from '../../lib/session';
import { useDepots, useForecasts, useForecastWarnings, useRefreshForecast } from '../../features/forecast/api/depots';
import { DepotsTable } from '../../features/forecast/components/depots-table';
import { ForecastWarnings } from '../../features/forecast/components/forecast-warnings';

/** Depots with their coordinates and the 48-hour forecast low; warnings for parked units with an unfinished purge. */
export function DepotsPage() {
  const role = useSession()?.user.role;
  const depots = useDepots();
  const forecasts = useForecasts();
  const warnings = useForecastWarnings();
  const refresh = useRefreshForecast();
  return (
    <>
      <PageHeader title="Depots and forecast" description="The lowest forecast temperature at each depot over the next 48 hours. DEF (AUS 32) freezes at about −11 °C (ISO 22241-1)."
        actions={(role === 'admin' || role === 'planner') && <Button onClick={() => refresh.mutate()} disabled={refresh.isPending}>{refresh.isPending ? 'Fetching…' : 'Fetch forecast now'}</Button>} />
      <ErrorNotice error={refresh.error} title="Could not fetch the forecast" />
      <Panel title="Freeze warnings" className="mb-6">
        {warnings.data ? <ForecastWarnings warnings={warnings.data} /> : <Loading />}
        <CautionNote className="mt-4">A forecast is not the temperature at the unit: exposed lines can cool below the air on a clear night. Where DEF may have frozen, follow the vehicle manufacturer&apos;s thaw and inspection procedure.</CautionNote>
      </Panel>
      {depots.isPending && <Loading label="Loading depots…" />}
      <ErrorNotice error={depots.error ?? forecasts.error} />
      {depots.data && <DepotsTable depots={depots.data} forecasts={forecasts.data ?? []} editable={role === 'admin'} />}
      {role === 'admin' && <p className="mt-2 text-sm text-muted">Coordinates in decimal degrees (WGS 84), e.g. 61.498, 23.761.</p>}
    </>
  );
}
