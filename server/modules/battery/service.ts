// Reads a unit's telemetry and power events from `messages`, cuts the parks with the isolator
// closed and runs the pure battery maths (shared/battery) on each.
import { QueryTypes, type Sequelize } from 'sequelize';
import { notFound } from '../../lib/errors';
import { parkedPeriods, type SupplySample } from '../../../shared/battery/parked-periods';
import { ADVICE_TEXT, adviseFrom, estimateDrain, MIN_WEEKEND_SOC, REST_HOURS, WEEKEND_HOURS } from '../../../shared/battery/drain';
import { stateOfCharge, type SystemVoltage } from '../../../shared/battery/state-of-charge';
import type { BatterySummary, BatteryUnit, Park } from '../../../shared/api/battery';

/** The advice weighs this many of the latest analysable parks (a design choice: about two working weeks). */
const ADVICE_PARKS = 10;

interface UnitRow { id: string; name: string; depot: string; system_voltage: SystemVoltage; loss_threshold_v: number }

async function samples(db: Sequelize, unitId: string, from: Date, to: Date): Promise<SupplySample[]> {
  const rows = await db.query<{ ts: Date; kind: string; payload: Record<string, unknown> }>(
    `SELECT ts, kind, payload FROM messages WHERE unit_id = $1 AND kind IN ('telemetry', 'power') AND ts >= $2 AND ts < $3
     ORDER BY ts, stream, boot, seq`,
    { bind: [unitId, from.toISOString(), to.toISOString()], type: QueryTypes.SELECT },
  );
  return rows.map((r) =>
    r.kind === 'telemetry'
      ? { ts: r.ts.getTime(), kind: 'telemetry', key: r.payload.key as 'on' | 'off', supplyV: Number(r.payload.supplyV) }
      : { ts: r.ts.getTime(), kind: 'power', event: r.payload.event as 'supply-lost' | 'supply-restored' | 'boot' },
  );
}

function analyse(unit: UnitRow, raw: SupplySample[]): { summary: BatterySummary; parks: Park[] } {
  const sv = unit.system_voltage;
  const parks: Park[] = parkedPeriods(raw, unit.loss_threshold_v).map((p) => ({
    chargeStoppedAt: new Date(p.chargeStoppedAt).toISOString(),
    lastAt: new Date(p.lastAt).toISOString(),
    endedBy: p.endedBy,
    hours: (p.lastAt - p.chargeStoppedAt) / 3_600_000,
    readings: p.readings.map((r) => ({ ts: new Date(r.ts).toISOString(), volts: r.volts, soc: stateOfCharge(r.volts, sv), rested: r.ts - p.chargeStoppedAt >= REST_HOURS * 3_600_000 })),
    estimate: estimateDrain(p.chargeStoppedAt, p.readings, sv),
  }));
  const analysed = parks.filter((p) => p.estimate);
  const recent = analysed.slice(-ADVICE_PARKS);
  const { advice, worstProjectedSoc } = adviseFrom(recent.map((p) => p.estimate));
  return {
    parks,
    summary: {
      unitId: unit.id, name: unit.name, depot: unit.depot, systemVoltage: sv,
      parks: parks.length,
      analysed: analysed.length,
      latestDrainPctPerHour: analysed.at(-1)?.estimate?.drainPctPerHour ?? null,
      worstProjectedSoc,
      advice,
      adviceText: ADVICE_TEXT[advice],
    },
  };
}

const UNIT_COLS = 'id, name, depot, system_voltage, loss_threshold_v';
const window = (days: number, now: number) => ({ from: new Date(now - days * 86_400_000), to: new Date(now + 60_000) });

export async function batteryOfUnit(db: Sequelize, unitId: string, days: number, now = Date.now()): Promise<BatteryUnit> {
  const [unit] = await db.query<UnitRow>(`SELECT ${UNIT_COLS} FROM units WHERE id = $1`, { bind: [unitId], type: QueryTypes.SELECT });
  if (!unit) throw notFound(`Unit ${unitId}`);
  const w = window(days, now);
  const { summary, parks } = analyse(unit, await samples(db, unitId, w.from, w.to));
  return { summary, restHours: REST_HOURS, weekendHours: WEEKEND_HOURS, minWeekendSoc: MIN_WEEKEND_SOC, parks: parks.reverse() };
}

export async function batteryOfFleet(db: Sequelize, q: { days: number; depot?: string }, now = Date.now()): Promise<BatterySummary[]> {
  const units = await db.query<UnitRow>(`SELECT ${UNIT_COLS} FROM units WHERE ($1::text IS NULL OR depot = $1) ORDER BY depot, id`, {
    bind: [q.depot ?? null], type: QueryTypes.SELECT,
  });
  const w = window(q.days, now);
  const out: BatterySummary[] = [];
  for (const u of units) out.push(analyse(u, await samples(db, u.id, w.from, w.to)).summary);
  // The units to act on first: drain too high, then the lowest projection.
  const rank = { drainTooHigh: 0, safeOverWeekend: 1, notEnoughData: 2 } as const;
  return out.sort((a, b) => rank[a.advice] - rank[b.advice] || (a.worstProjectedSoc ?? 101) - (b.worstProjectedSoc ?? 101));
}
