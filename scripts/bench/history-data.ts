// 90 days of purge history for the query benchmark, generated in SQL (as stream 99, apart from the
// live run's episodes): three key-offs a unit a day,
// about one in twenty interrupted.
import pg from 'pg';

export async function fillHistory(databaseUrl: string, days: number): Promise<number> {
  const c = new pg.Client({ connectionString: databaseUrl });
  await c.connect();
  const r = await c.query(`
    INSERT INTO episodes (unit_id, stream, boot, seq, key_off_at, purge_seconds, loss_threshold_v, outcome, settled_by, ended_at,
                          seconds_into_purge, ambient_c, final)
    SELECT u.id, 99, d, k, now() - (d || ' days')::interval - (k * 7 || ' hours')::interval, 120, u.loss_threshold_v,
           CASE WHEN (d * 3 + k + length(u.id)) % 20 = 0 THEN 'interrupted' ELSE 'completed' END,
           CASE WHEN (d * 3 + k + length(u.id)) % 20 = 0 THEN 'supplyLost' ELSE 'powerHeld' END,
           now() - (d || ' days')::interval - (k * 7 || ' hours')::interval + interval '2 minutes',
           CASE WHEN (d * 3 + k + length(u.id)) % 20 = 0 THEN 14.5 ELSE NULL END, -3.0, true
    FROM units u, generate_series(1, $1) d, generate_series(0, 2) k`, [days]);
  await c.query('ANALYZE episodes');
  await c.end();
  return r.rowCount ?? 0;
}
