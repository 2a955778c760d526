import { Link } from 'react-router-dom';
import { useAddressParams } from '../../lib/use-address-params';
import { ErrorNotice } from '../../components/ui/error-notice';
import { Loading } from '../../components/ui/loading';
import { PageHeader } from '../../components/ui/page-header';
import { Panel } from '../../components/ui/panel';
import { useUnits } from '../../features/units/api/get-units';
import { useWeeklyReport } from '../../features/reports/api/get-weekly-report';
import { FiguresTable } from '../../features/reports/components/figures-table';
import { ReportTotals } from '../../features/reports/components/report-totals';
import { TrendChart } from '../../features/reports/components/trend-chart';
import { isoWeekLabel, isoWeekStart } from '../../../shared/api/reports';
import { CONTROL_CLASS, DepotSelect } from '../../components/ui/depot-select';

const control = CONTROL_CLASS;
const WEEK_SPANS = [4, 8, 12, 26];

export function ReportsPage() {
  const { params, set } = useAddressParams();
  const weekParam = params.get('week');
  const week = weekParam && isoWeekStart(weekParam) !== null ? weekParam : isoWeekLabel(Date.now());
  const weeks = WEEK_SPANS.includes(Number(params.get('weeks'))) ? Number(params.get('weeks')) : 8;
  const depot = params.get('depot') ?? '';
  const report = useWeeklyReport({ week, weeks, depot: depot || undefined });
  const depots = [...new Set((useUnits().data ?? []).map((u) => u.depot))].sort();
  const r = report.data;

  return (
    <>
      <PageHeader title="Weekly report" description="Key-offs and interrupted purges by depot, unit and driver for one ISO week (Monday to Sunday, UTC), with the trend over the weeks before it." />
      <div role="search" aria-label="Report settings" className="mb-6 flex flex-wrap items-end gap-3">
        <label className="flex flex-col gap-1 text-sm font-medium text-muted">
          Week
          <input type="week" value={week} onChange={(e) => set('week', e.target.value)} className={control} />
        </label>
        <label className="flex flex-col gap-1 text-sm font-medium text-muted">
          Trend over
          <select value={weeks} onChange={(e) => set('weeks', e.target.value)} className={control}>
            {WEEK_SPANS.map((n) => <option key={n} value={n}>{n} weeks</option>)}
          </select>
        </label>
        <DepotSelect value={depot} depots={depots} onChange={(d) => set('depot', d)} className={control} />
      </div>
      {report.isPending && <Loading label="Building the report…" />}
      {report.isError && <ErrorNotice title="Could not load the report" error={report.error} />}
      {r && (
        <div className="flex flex-col gap-6">
          <ReportTotals f={r.total} />
          <Panel title={`Repeat offenders, ${r.trend[0].week} to ${r.week}`}>
            {r.repeatOffenders.units.length + r.repeatOffenders.drivers.length === 0 ? (
              <p className="text-muted">No unit or driver had two or more interrupted purges in these weeks.</p>
            ) : (
              <ul className="grid gap-2 md:grid-cols-2">
                {r.repeatOffenders.units.map((u) => (
                  <li key={u.unitId} className="rounded-md border border-danger/40 bg-danger/10 px-3 py-2">
                    <span className="font-semibold">{u.unitId}</span> · {u.unitName} ({u.depot}): {u.interrupted} interrupted of {u.keyOffs} key-offs
                  </li>
                ))}
                {r.repeatOffenders.drivers.map((d) => (
                  <li key={d.driverId} className="rounded-md border border-danger/40 bg-danger/10 px-3 py-2">
                    <Link to={`/drivers/${d.driverId}`} className="font-semibold underline">{d.driverName}</Link>: {d.interrupted} interrupted of {d.keyOffs} key-offs
                  </li>
                ))}
              </ul>
            )}
          </Panel>
          <Panel title="Trend by week">
            <TrendChart points={r.trend} />
          </Panel>
          <Panel title="By unit">
            <FiguresTable caption="By unit" rows={r.byUnit} rowKey={(u) => u.unitId}
              lead={[{ key: 'unit', header: 'Unit', cell: (u) => <span title={u.unitName}>{u.unitId}</span> }, { key: 'depot', header: 'Depot', cell: (u) => u.depot }]} />
          </Panel>
          <Panel title="By driver">
            <FiguresTable caption="By driver" rows={r.byDriver} rowKey={(d) => String(d.driverId ?? 'none')}
              lead={[{ key: 'driver', header: 'Driver', cell: (d) => (d.driverId === null ? <span className="text-muted">No assignment on file</span> : <Link className="underline" to={`/drivers/${d.driverId}`}>{d.driverName}</Link>) }]} />
          </Panel>
          <Panel title="By depot">
            <FiguresTable caption="By depot" rows={r.byDepot} rowKey={(d) => d.depot} lead={[{ key: 'depot', header: 'Depot', cell: (d) => d.depot }]} />
          </Panel>
        </div>
      )}
    </>
  );
}
