import { Link, useParams } from 'react-router-dom';
import { ErrorNotice } from '../../components/ui/error-notice';
import { Loading } from '../../components/ui/loading';
import { PageHeader } from '../../components/ui/page-header';
import { Panel } from '../../components/ui/panel';
import { useCoaching } from '../../features/drivers/api/get-coaching';
import { ReportTotals } from '../../features/reports/components/report-totals';
import { TrendChart } from '../../features/reports/components/trend-chart';
import { EpisodeHistoryTable } from '../../features/history/components/episode-history-table';

export function DriverCoachingPage() {
  const id = Number(useParams().id);
  const c = useCoaching(id, 12);
  if (!Number.isInteger(id) || id <= 0) return <ErrorNotice error={new Error('No such driver.')} />;
  return (
    <>
      <PageHeader
        title={c.data ? `${c.data.driver.name} (${c.data.driver.code})` : 'Driver'}
        description="The last 12 ISO weeks: how often this driver's key-offs ended in an interrupted purge, week by week, and the latest key-offs. For a talk about waiting for 'Safe to isolate', not for blame: a high drain battery or a rushed shift change are common reasons."
        actions={<Link to={`/history?driverId=${id}`} className="self-center underline">All of this driver's history</Link>}
      />
      {c.isPending && <Loading />}
      {c.isError && <ErrorNotice title="Could not load the coaching view" error={c.error} />}
      {c.data && (
        <div className="flex flex-col gap-6">
          <ReportTotals f={c.data.totals} />
          <Panel title="Trend by week"><TrendChart points={c.data.trend} label={`Weekly trend for ${c.data.driver.name}`} /></Panel>
          <Panel title="Latest key-offs"><EpisodeHistoryTable rows={c.data.lastEvents} /></Panel>
        </div>
      )}
    </>
  );
}
