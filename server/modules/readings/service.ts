// What the unit page draws: supply voltage and ambient over time, and a timeline of key, power and contact events.
import { QueryTypes, type Sequelize } from 'sequelize';

export interface RangeQuery {
  unitId: string;
  from: Date;
  to: Date;
}

interface ReadingRow { ts: Date; supply_v: number; ambient_c: number | null; key: 'on' | 'off' }

/** Telemetry samples in [from, to), thinned evenly to at most maxPoints (every extreme low of supply kept). */
export async function readings(sequelize: Sequelize, q: RangeQuery & { maxPoints: number }) {
  const rows = await sequelize.query<ReadingRow>(
    `SELECT ts, (payload->>'supplyV')::float8 AS supply_v, (payload->>'ambientC')::float8 AS ambient_c, payload->>'key' AS key
     FROM messages WHERE unit_id = $1 AND kind = 'telemetry' AND ts >= $2 AND ts < $3 ORDER BY ts`,
    { bind: [q.unitId, q.from.toISOString(), q.to.toISOString()], type: QueryTypes.SELECT },
  );
  const step = Math.max(1, Math.ceil(rows.length / q.maxPoints));
  const kept = step === 1 ? rows : rows.filter((r, i) => i % step === 0 || r.supply_v < (rows[i - 1]?.supply_v ?? Infinity) - 2);
  return kept.map((r) => ({ ts: r.ts.toISOString(), supplyV: r.supply_v, ambientC: r.ambient_c, key: r.key }));
}

export interface TimelineEntry {
  at: string;
  kind: 'keyOn' | 'keyOff' | 'supplyLost' | 'supplyRestored' | 'boot' | 'online' | 'offline';
  detail: string | null;
}

export async function timeline(sequelize: Sequelize, q: RangeQuery): Promise<TimelineEntry[]> {
  const msgs = await sequelize.query<{ ts: Date; kind: string; payload: Record<string, any> }>(
    `SELECT ts, kind, payload FROM messages WHERE unit_id = $1 AND kind IN ('telemetry', 'power') AND ts >= $2 AND ts < $3
     ORDER BY stream, boot, seq`,
    { bind: [q.unitId, q.from.toISOString(), q.to.toISOString()], type: QueryTypes.SELECT },
  );
  const out: TimelineEntry[] = [];
  let key: string | null = null;
  for (const m of msgs) {
    const at = m.ts.toISOString();
    if (m.kind === 'telemetry') {
      if (key !== null && m.payload.key !== key) out.push({ at, kind: m.payload.key === 'on' ? 'keyOn' : 'keyOff', detail: `${m.payload.supplyV} V` });
      key = m.payload.key;
    } else if (m.payload.event === 'supply-lost') out.push({ at, kind: 'supplyLost', detail: `${m.payload.supplyV} V` });
    else if (m.payload.event === 'supply-restored') out.push({ at, kind: 'supplyRestored', detail: `${m.payload.supplyV} V` });
    else if (m.payload.event === 'boot') {
      const prev = m.payload.prevShutdown;
      out.push({ at, kind: 'boot', detail: prev ? `previous boot ended ${prev.ts} (${prev.cause})` : 'previous shutdown unknown' });
      key = null;
    }
  }
  const status = await sequelize.query<{ at: Date; state: 'online' | 'offline'; gateway_id: string }>(
    `SELECT at, state, gateway_id FROM gateway_status_events WHERE unit_id = $1 AND at >= $2 AND at < $3 ORDER BY at`,
    { bind: [q.unitId, q.from.toISOString(), q.to.toISOString()], type: QueryTypes.SELECT },
  );
  for (const s of status) out.push({ at: s.at.toISOString(), kind: s.state, detail: `gateway ${s.gateway_id}` });
  return out.sort((a, b) => (a.at < b.at ? 1 : a.at > b.at ? -1 : 0));
}

export async function recordStatus(sequelize: Sequelize, gatewayId: string, unitId: string | null, state: string, boot: number | null) {
  await sequelize.query(`INSERT INTO gateway_status_events (gateway_id, unit_id, state, boot) VALUES ($1, $2, $3, $4)`, { bind: [gatewayId, unitId, state, boot] });
}
