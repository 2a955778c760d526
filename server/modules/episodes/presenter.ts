import type { EpisodeRecord } from './service';

const iso = (d: Date | null) => (d ? d.toISOString() : null);

export const presentEpisode = (e: EpisodeRecord) => ({
  id: Number(e.id),
  unitId: e.unit_id,
  keyOffAt: e.key_off_at.toISOString(),
  purgeSeconds: e.purge_seconds,
  outcome: e.outcome,
  endedAt: iso(e.ended_at),
  secondsIntoPurge: e.outcome === 'interrupted' ? e.seconds_into_purge : null,
  settledBy: e.settled_by,
  ambientC: e.ambient_c,
  minAmbientAfterC: e.min_ambient_after_c,
  freezeExposure: e.freeze_exposure,
  evidence: e.evidence,
  final: e.final,
});
