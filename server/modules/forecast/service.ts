// Polls the forecast for every located depot, keeps its lows, and warns parked units with an unsettled
// or interrupted purge where the low reaches the DEF freezing point (ISO 22241-1: about -11 °C).
import { QueryTypes, type Sequelize } from 'sequelize';
import type { Logger } from 'pino';
import { raiseAlert } from '../alerts/service';
import type { AlertView } from '../../../shared/realtime/envelope';
import { fetchHourlyTemperatures } from './client';
import { locatedDepots } from './depots';
import { lowAhead, needsForecastWarning, type EpisodeOutcome, type ForecastLow } from './lows';

export interface ForecastDeps {
  sequelize: Sequelize;
  baseUrl: string;
  log: Logger;
  unitState(unitId: string): string | null;
  publish(alert: AlertView): void;
  now?: () => number;
}

export interface RefreshResult {
  depots: { depot: string; lowC: number | null; lowAt: string | null; error: string | null }[];
  alerts: AlertView[];
}

const fmtC = (c: number) => `${c.toFixed(1).replace('-', '−')} °C`;
const fmtAt = (d: Date) => `${d.toISOString().slice(0, 16).replace('T', ' ')} UTC`;

async function keepLow(sequelize: Sequelize, depot: string, low: ForecastLow, fetchedAt: Date) {
  await sequelize.query(
    `INSERT INTO depot_forecasts (depot, fetched_at, low_c, low_at, hours) VALUES ($1, $2, $3, $4, $5::jsonb)
     ON CONFLICT (depot) DO UPDATE SET fetched_at = $2, low_c = $3, low_at = $4, hours = $5::jsonb`,
    { bind: [depot, fetchedAt, low.lowC, low.lowAt, JSON.stringify(low.hours.map((h) => ({ at: h.at.toISOString(), c: h.c })))] },
  );
}

async function warnDepot(deps: ForecastDeps, depot: string, low: ForecastLow): Promise<AlertView[]> {
  const latest = await deps.sequelize.query<{ unit_id: string; episode_id: string | null; outcome: EpisodeOutcome | null }>(
    `SELECT u.id AS unit_id, e.id AS episode_id, e.outcome FROM units u
     LEFT JOIN LATERAL (SELECT id, outcome FROM episodes WHERE unit_id = u.id ORDER BY key_off_at DESC, id DESC LIMIT 1) e ON true
     WHERE u.depot = $1`,
    { bind: [depot], type: QueryTypes.SELECT },
  );
  const raised: AlertView[] = [];
  for (const row of latest) {
    if (row.episode_id === null || !needsForecastWarning(deps.unitState(row.unit_id), row.outcome, low)) continue;
    const alert = await raiseAlert(deps.sequelize, row.unit_id, Number(row.episode_id), 'forecastFreeze');
    if (!alert) continue;
    const comment = `Forecast at ${depot}: ${fmtC(low.lowC)} around ${fmtAt(low.lowAt)}, at or under the DEF freezing point from ${fmtAt(low.freezeFrom!)}. Run a full purge before then.`;
    await deps.sequelize.query(`UPDATE alerts SET comment = $2 WHERE id = $1`, { bind: [alert.id, comment] });
    await deps.sequelize.query(`INSERT INTO forecast_alerts (alert_id, depot, low_c, low_at, act_by) VALUES ($1, $2, $3, $4, $5) ON CONFLICT DO NOTHING`, {
      bind: [alert.id, depot, low.lowC, low.lowAt, low.freezeFrom],
    });
    raised.push({ ...alert, comment });
  }
  return raised;
}

export async function refreshForecasts(deps: ForecastDeps): Promise<RefreshResult> {
  const now = new Date((deps.now ?? Date.now)());
  const result: RefreshResult = { depots: [], alerts: [] };
  for (const d of await locatedDepots(deps.sequelize)) {
    try {
      const low = lowAhead(await fetchHourlyTemperatures(deps.baseUrl, d.latitude, d.longitude), now);
      if (!low) throw new Error('the forecast has no hours in the next 48 h');
      await keepLow(deps.sequelize, d.name, low, now);
      const alerts = await warnDepot(deps, d.name, low);
      for (const a of alerts) deps.publish(a);
      result.alerts.push(...alerts);
      result.depots.push({ depot: d.name, lowC: low.lowC, lowAt: low.lowAt.toISOString(), error: null });
    } catch (err) {
      deps.log.warn({ err, depot: d.name }, 'forecast not refreshed');
      result.depots.push({ depot: d.name, lowC: null, lowAt: null, error: err instanceof Error ? err.message : String(err) });
    }
  }
  return result;
}

export async function listForecasts(sequelize: Sequelize) {
  const rows = await sequelize.query<{ depot: string; fetched_at: Date; low_c: number; low_at: Date; hours: { at: string; c: number }[] }>(
    'SELECT depot, fetched_at, low_c, low_at, hours FROM depot_forecasts ORDER BY depot',
    { type: QueryTypes.SELECT },
  );
  return rows.map((r) => ({ depot: r.depot, fetchedAt: r.fetched_at.toISOString(), lowC: r.low_c, lowAt: r.low_at.toISOString(), hours: r.hours }));
}

/** Open forecast warnings with the time to act (the first forecast hour at or under the freezing point). */
export async function listForecastWarnings(sequelize: Sequelize) {
  const rows = await sequelize.query<{ alert_id: string; unit_id: string; depot: string; low_c: number; low_at: Date; act_by: Date; status: string }>(
    `SELECT f.alert_id, a.unit_id, f.depot, f.low_c, f.low_at, f.act_by, a.status FROM forecast_alerts f JOIN alerts a ON a.id = f.alert_id
     WHERE a.status <> 'resolved' ORDER BY f.act_by`,
    { type: QueryTypes.SELECT },
  );
  return rows.map((r) => ({ alertId: Number(r.alert_id), unitId: r.unit_id, depot: r.depot, lowC: r.low_c, lowAt: r.low_at.toISOString(), actBy: r.act_by.toISOString(), status: r.status }));
}
