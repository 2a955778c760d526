// Where a work order comes from: an alert, an episode or a fault, each pointing at a unit.
import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import { notFound } from '../../lib/errors';
import type { WorkOrderCreate } from '../../../shared/api/work-orders';

export interface ResolvedSource {
  unitId: string;
  alertId: number | null;
  episodeId: number | null;
  faultId: number | null;
  title: string;
}

const ALERT_TITLES: Record<string, string> = {
  interruptedPurge: 'Interrupted purge',
  undeterminedCold: 'Purge not confirmed in the cold',
  contactLost: 'Contact lost during the purge',
  forecastFreeze: 'Freezing forecast with an unsettled purge',
};

export async function resolveSource(sequelize: Sequelize, source: WorkOrderCreate['source'], transaction: Transaction): Promise<ResolvedSource> {
  const one = async <T extends object>(sql: string) => (await sequelize.query<T>(sql, { bind: [source.id], type: QueryTypes.SELECT, transaction }))[0];
  if (source.kind === 'alert') {
    const a = await one<{ unit_id: string; episode_id: string | null; kind: string }>('SELECT unit_id, episode_id, kind FROM alerts WHERE id = $1');
    if (!a) throw notFound(`Alert ${source.id}`);
    return { unitId: a.unit_id, alertId: source.id, episodeId: a.episode_id === null ? null : Number(a.episode_id), faultId: null, title: `${ALERT_TITLES[a.kind] ?? a.kind} on ${a.unit_id}` };
  }
  if (source.kind === 'episode') {
    const e = await one<{ unit_id: string; outcome: string }>('SELECT unit_id, outcome FROM episodes WHERE id = $1');
    if (!e) throw notFound(`Episode ${source.id}`);
    return { unitId: e.unit_id, alertId: null, episodeId: source.id, faultId: null, title: `Purge episode ${source.id} (${e.outcome}) on ${e.unit_id}` };
  }
  const f = await one<{ unit_id: string; spn: number; fmi: number; episode_id: string | null }>('SELECT unit_id, spn, fmi, episode_id FROM faults WHERE id = $1');
  if (!f) throw notFound(`Fault ${source.id}`);
  return { unitId: f.unit_id, alertId: null, episodeId: f.episode_id === null ? null : Number(f.episode_id), faultId: source.id, title: `Fault SPN ${f.spn} FMI ${f.fmi} on ${f.unit_id}` };
}
