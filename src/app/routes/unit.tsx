import { useMemo, useState } from 'react';
import { Link, useParams, useSearchParams } from 'react-router-dom';
import { Button } from '../../components/ui/button';
import { CautionNote } from '../../components/ui/caution-note';
import { ErrorNotice } from '../../components/ui/error-notice';
import { Loading } from '../../components/ui/loading';
import { Panel } from '../../components/ui/panel';
import { StateBadge } from '../../components/ui/state-badge';
import { formatCelsius, formatCountdown, formatDateTime, formatDuration, formatVolts } from '../../lib/format';
import { useSession } from '../../lib/session';
import { timeInState } from '../../lib/time-in-state';
import { isRangeKey, RANGES, type RangeKey } from '../../lib/time-range';
import { STATE_HINTS } from '../../lib/unit-state';
import { useNow } from '../../lib/use-now';
import { useUnitEpisodes } from '../../features/episodes/api/get-episodes';
import { UnitHistory } from '../../features/episodes/components/unit-history';
import { OUTCOME_LABELS } from '../../features/episodes/lib/episode-words';
import { useUnitFaults } from '../../features/faults/api/get-faults';
import { FaultsTable } from '../../features/faults/components/faults-table';
import { useReadings } from '../../features/readings/api/get-readings';
import { useTimeline } from '../../features/readings/api/get-timeline';
import { ReadingsChart, type PurgeWindow } from '../../features/readings/components/readings-chart';
import { SwitchControls } from '../../features/switch/components/switch-controls';
import { useUnit } from '../../features/units/api/get-unit';
import { EditProfileDialog } from '../../features/units/components/edit-profile-dialog';
import { remainingSeconds } from '../../features/units/lib/purge-countdown';
import type { Unit } from '../../features/units/types';

function UnitHeader({ unit }: { unit: Unit }) {
  const now = useNow();
  const left = unit.state === 'purging' ? remainingSeconds(unit.purgeRemainingS, unit.receivedAt ?? now, now) : null;
  const t = timeInState(unit, now);
  return (
    <div className="mb-6 flex flex-wrap items-start justify-between gap-6">
      <div>
        <p className="text-sm text-muted">
          <Link to="/board" className="text-accent hover:underline">
            Board
          </Link>{' '}
          / {unit.depot}
        </p>
        <h1 className="font-mono text-4xl font-semibold tracking-tight">{unit.id}</h1>
        <p className="text-xl text-muted">{unit.name}</p>
      </div>
      <div className="flex flex-col items-end gap-2">
        <StateBadge state={unit.state} size="xl" detail={left !== null ? `${formatCountdown(left)} left` : undefined} />
        {unit.state && <p className="text-muted">{STATE_HINTS[unit.state]}</p>}
        <p className="font-mono text-sm tabular-nums text-muted">
          {[
            t && `in state ${formatDuration(t.ms)}${t.byUnitClock ? ' (unit clock)' : ''}`,
            `supply ${formatVolts(unit.lastSupplyV)}`,
            `ambient ${formatCelsius(unit.lastAmbientC)}`,
            `last message ${formatDateTime(unit.lastSeenAt)}`,
          ]
            .filter(Boolean)
            .join(' · ')}
        </p>
      </div>
    </div>
  );
}

function Profile({ unit, isAdmin, onEdit }: { unit: Unit; isAdmin: boolean; onEdit: () => void }) {
  const rows: [string, string][] = [
    ['Depot', unit.depot],
    ['System voltage', `${unit.systemVoltage} V`],
    ['Purge length', `${unit.purgeSeconds} s`],
    ['Loss threshold', `${unit.lossThresholdV.toFixed(1)} V`],
    // Protocol rule 10: no list links faults of every SPN; a list (even an empty one) only those.
    ['Linked SPNs', unit.linkSpns === null ? 'all SPNs' : unit.linkSpns.length ? unit.linkSpns.join(', ') : 'none'],
    ['Gateway', unit.gatewayId ?? 'none'],
  ];
  return (
    <>
      <dl className="grid grid-cols-2 gap-x-6 gap-y-2">
        {rows.map(([k, v]) => (
          <div key={k}>
            <dt className="text-sm text-muted">{k}</dt>
            <dd className="font-medium">{v}</dd>
          </div>
        ))}
      </dl>
      {isAdmin && (
        <Button className="mt-4" onClick={onEdit}>
          Edit profile
        </Button>
      )}
    </>
  );
}

function UnitContent({ id }: { id: string }) {
  const unit = useUnit(id);
  const [params, setParams] = useSearchParams();
  const raw = params.get('range');
  const range: RangeKey = isRangeKey(raw) ? raw : '24h';
  const episodes = useUnitEpisodes(id, range);
  const timeline = useTimeline(id, range);
  const readings = useReadings(id, range);
  const faults = useUnitFaults(id, range);
  const isAdmin = useSession()?.user.role === 'admin';
  const [editing, setEditing] = useState(false);

  const windows = useMemo<PurgeWindow[]>(
    () =>
      (episodes.data ?? []).map((e) => {
        const from = Date.parse(e.keyOffAt);
        return {
          from,
          to: from + e.purgeSeconds * 1000,
          interruptedAt: e.outcome === 'interrupted' && e.secondsIntoPurge !== null ? from + e.secondsIntoPurge * 1000 : null,
        };
      }),
    [episodes.data],
  );
  const episodeLabel = (episodeId: number) => {
    const e = episodes.data?.find((x) => x.id === episodeId);
    return e ? `${OUTCOME_LABELS[e.outcome]}, ${formatDateTime(e.keyOffAt)}` : `episode ${episodeId}`;
  };
  // The chart's range ends a minute after the readings were fetched, like the query's own bounds.
  const chartTo = (readings.dataUpdatedAt || Date.now()) + 60_000;

  if (unit.isPending) return <Loading label="Loading the unit…" />;
  if (unit.isError) return <ErrorNotice title={`Could not load unit ${id}`} error={unit.error} />;
  const u = unit.data;

  return (
    <>
      <UnitHeader unit={u} />
      <div className="mb-4 flex flex-wrap items-center gap-2" role="group" aria-label="Range">
        <span className="mr-1 text-sm font-medium text-muted">Range</span>
        {(Object.keys(RANGES) as RangeKey[]).map((k) => (
          <Button key={k} size="sm" variant={k === range ? 'primary' : 'secondary'} aria-pressed={k === range} onClick={() => setParams(k === '24h' ? {} : { range: k }, { replace: true })}>
            {RANGES[k].label}
          </Button>
        ))}
      </div>
      <Panel title="Supply and ambient" className="mb-6">
        {readings.isError && <ErrorNotice title="Could not load the readings" error={readings.error} />}
        {readings.data && readings.data.length === 0 && <p className="mb-2 text-muted">No readings in this range.</p>}
        {readings.data && readings.data.length > 0 && <ReadingsChart readings={readings.data} windows={windows} fromMs={chartTo - RANGES[range].ms} toMs={chartTo} />}
        <p className="mt-2 text-sm text-muted">
          Shaded: purge windows (key-off to key-off + purge length). Dashed red line marked “× interrupted”: where a purge lost power.
        </p>
      </Panel>
      <div className="grid gap-6 xl:grid-cols-[2fr_1fr]">
        <Panel title="Timeline and purges">
          {(episodes.isPending || timeline.isPending) && <Loading label="Loading the timeline…" />}
          {episodes.isError && <ErrorNotice title="Could not load the purge episodes" error={episodes.error} />}
          {timeline.isError && <ErrorNotice title="Could not load the timeline" error={timeline.error} />}
          {episodes.data && timeline.data && <UnitHistory events={timeline.data} episodes={episodes.data} lossThresholdV={u.lossThresholdV} />}
        </Panel>
        <div className="flex flex-col gap-6">
          <Panel title="Profile">
            <Profile unit={u} isAdmin={isAdmin} onEdit={() => setEditing(true)} />
          </Panel>
          {isAdmin && (
            <Panel title="Switch page">
              <SwitchControls unitId={u.id} depot={u.depot} />
            </Panel>
          )}
        </div>
      </div>
      <section className="mt-6">
        <h2 className="mb-3 text-xl font-semibold">Faults</h2>
        {faults.isError && <ErrorNotice title="Could not load the faults" error={faults.error} />}
        {faults.data && <FaultsTable faults={faults.data} episodeLabel={episodeLabel} />}
      </section>
      <CautionNote className="mt-8" />
      {isAdmin && <EditProfileDialog unit={editing ? u : null} onClose={() => setEditing(false)} />}
    </>
  );
}

export function UnitPage() {
  const id = useParams().id ?? '';
  // Keyed by id so moving between units starts each page fresh.
  return <UnitContent key={id} id={id} />;
}
