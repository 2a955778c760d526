import { useState } from 'react';
import { ErrorNotice } from '../../../components/ui/error-notice';
import { Loading } from '../../../components/ui/loading';
import { formatDateTime, formatDuration } from '../../../lib/format';
import { useBatteryUnit } from '../api/get-battery';
import { AdviceBadge } from './advice-badge';
import { DrainChart } from './drain-chart';

const ENDED: Record<string, string> = { keyOn: 'key on', supplyLost: 'isolated', boot: 'gateway restarted', gap: 'readings stopped', open: 'still parked' };

export function UnitBattery({ unitId, days }: { unitId: string; days: number }) {
  const q = useBatteryUnit(unitId, days);
  const [pick, setPick] = useState<number | null>(null);
  if (q.isPending) return <Loading label={`Loading ${unitId}…`} />;
  if (q.isError) return <ErrorNotice title={`Could not load ${unitId}`} error={q.error} />;
  const { summary, parks, restHours, weekendHours, minWeekendSoc } = q.data;
  const defaultIndex = Math.max(0, parks.findIndex((p) => p.estimate));
  const index = pick !== null && pick < parks.length ? pick : defaultIndex;
  const park = parks[index];
  return (
    <div className="flex flex-col gap-4">
      <div className="flex flex-wrap items-center gap-3">
        <h3 className="text-lg font-semibold">{summary.unitId} · {summary.name}</h3>
        <AdviceBadge s={summary} />
      </div>
      <p className="text-muted">
        Readings in the first {restHours} h after key-off are left out (surface charge). The fitted line is carried on to {weekendHours} h, a Friday-evening-to-Monday park; the advice asks for at least {minWeekendSoc} % then.
      </p>
      {parks.length === 0 ? (
        <p className="text-muted">No park with the isolator closed in the last {days} days.</p>
      ) : (
        <>
          <label className="flex w-fit flex-col gap-1 text-sm font-medium text-muted">
            Park
            <select value={index} onChange={(e) => setPick(Number(e.target.value))} className="rounded-md border border-line bg-raised px-3 py-2 text-base text-fg">
              {parks.map((p, i) => (
                <option key={p.chargeStoppedAt} value={i}>
                  {formatDateTime(p.chargeStoppedAt)} · {formatDuration(p.hours * 3_600_000)} · {ENDED[p.endedBy]} · {p.estimate ? `${p.estimate.drainPctPerHour.toFixed(2)} %/h, ${p.estimate.projectedSocAfterWeekend.toFixed(0)} % after ${weekendHours} h` : 'too short to judge'}
                </option>
              ))}
            </select>
          </label>
          <DrainChart park={park} systemVoltage={summary.systemVoltage} weekendHours={weekendHours} minSoc={minWeekendSoc} />
        </>
      )}
    </div>
  );
}
