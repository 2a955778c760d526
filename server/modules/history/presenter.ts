import { describeFmi } from '../../../shared/j1939/fmi';
import type { HistoryEpisodeRow, HistoryFaultRow } from '../../../shared/api/history-query';
import type { HistoryEpisodeRecord } from './episodes';
import type { HistoryFaultRecord } from './faults';

const iso = (d: Date | null) => (d ? d.toISOString() : null);

export const presentHistoryEpisode = (e: HistoryEpisodeRecord): HistoryEpisodeRow => ({
  id: Number(e.id),
  unitId: e.unit_id,
  unitName: e.unit_name,
  depot: e.depot,
  driverId: e.driver_id,
  driverName: e.driver_name,
  keyOffAt: e.key_off_at.toISOString(),
  purgeSeconds: e.purge_seconds,
  outcome: e.outcome,
  settledBy: e.settled_by,
  endedAt: iso(e.ended_at),
  secondsIntoPurge: e.outcome === 'interrupted' ? e.seconds_into_purge : null,
  ambientC: e.ambient_c,
  minAmbientAfterC: e.min_ambient_after_c,
  freezeExposure: e.freeze_exposure,
  faultCount: e.fault_count,
});

export const presentHistoryFault = (f: HistoryFaultRecord): HistoryFaultRow => ({
  id: Number(f.id),
  unitId: f.unit_id,
  unitName: f.unit_name,
  depot: f.depot,
  driverId: f.driver_id,
  driverName: f.driver_name,
  at: f.at.toISOString(),
  sourceAddress: f.source_address,
  spn: f.spn,
  fmi: f.fmi,
  fmiText: describeFmi(f.fmi),
  occurrenceCount: f.occurrence_count,
  episodeId: f.episode_id === null ? null : Number(f.episode_id),
});

/** CSV columns, in order: [header, value]. Times stay ISO 8601 UTC so a spreadsheet sorts them right. */
export const EPISODE_CSV: [string, (r: HistoryEpisodeRow) => string | number | null][] = [
  ['episode_id', (r) => r.id],
  ['unit_id', (r) => r.unitId],
  ['unit_name', (r) => r.unitName],
  ['depot', (r) => r.depot],
  ['driver', (r) => r.driverName],
  ['key_off_at', (r) => r.keyOffAt],
  ['purge_seconds', (r) => r.purgeSeconds],
  ['outcome', (r) => r.outcome],
  ['settled_by', (r) => r.settledBy],
  ['ended_at', (r) => r.endedAt],
  ['seconds_into_purge', (r) => r.secondsIntoPurge],
  ['ambient_c', (r) => r.ambientC],
  ['min_ambient_after_c', (r) => r.minAmbientAfterC],
  ['freeze_exposure', (r) => r.freezeExposure],
  ['linked_faults', (r) => r.faultCount],
];

export const FAULT_CSV: [string, (r: HistoryFaultRow) => string | number | null][] = [
  ['fault_id', (r) => r.id],
  ['unit_id', (r) => r.unitId],
  ['unit_name', (r) => r.unitName],
  ['depot', (r) => r.depot],
  ['driver', (r) => r.driverName],
  ['at', (r) => r.at],
  ['source_address', (r) => r.sourceAddress],
  ['spn', (r) => r.spn],
  ['fmi', (r) => r.fmi],
  ['fmi_text', (r) => r.fmiText],
  ['occurrence_count', (r) => r.occurrenceCount],
  ['episode_id', (r) => r.episodeId],
];
