// The forecast poller: refreshes on a timer and on demand (one refresh at a time), and settles a
// forecast warning once the episode it was about completes or resumes.
import type { FleetEvents } from '../../ingest/fleet-events';
import { settleAlerts } from '../alerts/service';
import { refreshForecasts, type ForecastDeps, type RefreshResult } from './service';

export function startForecastPoller(deps: ForecastDeps & { events: FleetEvents; pollMs: number }) {
  // One refresh at a time; an on-demand refresh runs after the current one, so it sees the latest settings.
  let last: Promise<unknown> = Promise.resolve();
  let busy = false;
  const refresh = (): Promise<RefreshResult> => {
    const next = last.catch(() => undefined).then(async () => {
      busy = true;
      try {
        return await refreshForecasts(deps);
      } finally {
        busy = false;
      }
    });
    last = next;
    return next;
  };
  const onTimer = () => {
    if (!busy) refresh().catch((err) => deps.log.warn({ err }, 'forecast poll failed'));
  };
  const timer = setInterval(onTimer, deps.pollMs);
  timer.unref();
  const first = setTimeout(onTimer, 2000);
  first.unref();

  deps.events.on('episodes', (changes) => {
    for (const c of changes) {
      if (c.episode.outcome !== 'completed' && c.episode.outcome !== 'resumed') continue;
      settleAlerts(deps.sequelize, c.id, ['forecastFreeze'], `settled: ${c.episode.outcome}`)
        .then((settled) => settled.forEach(deps.publish))
        .catch((err) => deps.log.warn({ err, unitId: c.unitId }, 'forecast warning not settled'));
    }
  });
  return {
    refresh,
    async stop() {
      clearInterval(timer);
      clearTimeout(first);
      await last.catch(() => undefined);
    },
  };
}
