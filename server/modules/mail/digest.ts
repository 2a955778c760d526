// The weekly digest to planners: the last seven days by depot.
import { QueryTypes, type Sequelize } from 'sequelize';

interface DepotWeek { depot: string; key_offs: string; interrupted: string; alerts: string; forecast_warnings: string; orders_open: string; orders_closed: string }

export async function buildDigest(sequelize: Sequelize, now: Date) {
  const from = new Date(now.getTime() - 7 * 86_400_000);
  const rows = await sequelize.query<DepotWeek>(
    `SELECT u.depot,
       count(e.id) FILTER (WHERE e.key_off_at >= $1) AS key_offs,
       count(e.id) FILTER (WHERE e.key_off_at >= $1 AND e.outcome = 'interrupted') AS interrupted,
       (SELECT count(*) FROM alerts a JOIN units ua ON ua.id = a.unit_id WHERE ua.depot = u.depot AND a.raised_at >= $1) AS alerts,
       (SELECT count(*) FROM alerts a JOIN units ua ON ua.id = a.unit_id WHERE ua.depot = u.depot AND a.raised_at >= $1 AND a.kind = 'forecastFreeze') AS forecast_warnings,
       (SELECT count(*) FROM work_orders w JOIN units uw ON uw.id = w.unit_id WHERE uw.depot = u.depot AND w.status <> 'closed') AS orders_open,
       (SELECT count(*) FROM work_orders w JOIN units uw ON uw.id = w.unit_id WHERE uw.depot = u.depot AND w.closed_at >= $1) AS orders_closed
     FROM units u LEFT JOIN episodes e ON e.unit_id = u.id AND e.key_off_at >= $1 AND e.key_off_at < $2
     GROUP BY u.depot ORDER BY u.depot`,
    { bind: [from, now], type: QueryTypes.SELECT },
  );
  const day = (d: Date) => d.toISOString().slice(0, 10);
  const lines = [`Afterwatch weekly digest, ${day(from)} to ${day(now)} (UTC).`, ''];
  if (!rows.length) lines.push('No units yet.');
  for (const r of rows) {
    const keyOffs = Number(r.key_offs);
    const interrupted = Number(r.interrupted);
    const share = keyOffs ? ` (${((100 * interrupted) / keyOffs).toFixed(0)} %)` : '';
    lines.push(
      `${r.depot}: ${keyOffs} key-offs, ${interrupted} interrupted purges${share}, ${r.alerts} alerts (${r.forecast_warnings} for freezing forecasts), ` +
        `${r.orders_open} work orders open, ${r.orders_closed} closed this week.`,
    );
  }
  lines.push('', 'Open the planner\'s desk in Afterwatch for the details.');
  return { subject: `Afterwatch weekly digest ${day(from)} – ${day(now)}`, text: lines.join('\n') };
}

export async function plannerEmails(sequelize: Sequelize) {
  const rows = await sequelize.query<{ email: string }>(`SELECT email FROM users WHERE role = 'planner' AND active ORDER BY email`, { type: QueryTypes.SELECT });
  return rows.map((r) => r.email);
}

/** The scheduled slot this moment falls in: the week's weekday (1 = Monday … 7 = Sunday) and hour in UTC, once passed. */
export function digestSlot(now: Date, weekday: number, hourUtc: number): string | null {
  const dow = now.getUTCDay() === 0 ? 7 : now.getUTCDay();
  const monday = new Date(Date.UTC(now.getUTCFullYear(), now.getUTCMonth(), now.getUTCDate() - (dow - 1)));
  const slot = new Date(monday.getTime() + (weekday - 1) * 86_400_000 + hourUtc * 3600_000);
  return now.getTime() >= slot.getTime() ? `week-of-${monday.toISOString().slice(0, 10)}` : null;
}
