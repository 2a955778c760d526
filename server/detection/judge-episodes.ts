import { SETTLE_GRACE_MS } from '../../shared/protocol/limits';
import type { Episode, JudgeInput, PowerEvent, Profile, UnitEvent } from './types';
import { positionKey, positionOf, sameBoot } from './positions';
import { settleFromBootRecord, settleFromSameBoot } from './settle-episode';

/** An ambient older than this before the key-off says little about the air at key-off (a design choice). */
export const AMBIENT_LOOKBACK_MS = 60 * 60_000;

export interface JudgedEpisode {
  episode: Episode;
  /** Index (in the ordered events) of the key-on sample just before the key-off, same boot. */
  anchorIndex: number;
  keyOffIndex: number;
  /** Index of the settling message, null while pending or undetermined. */
  evidenceIndex: number | null;
}

/** Protocol rule 2: an episode keeps the profile it started with; a re-judged key-off reuses the stored one. */
function profileFor(keyOffKey: string, given: Profile, previous: JudgeInput['previousEpisodes']): Profile {
  const stored = previous?.find((e) => positionKey(e.keyOff) === keyOffKey);
  return stored ? { purgeSeconds: stored.purgeSeconds, lossThresholdV: stored.lossThresholdV } : given;
}

/** The first `boot` power event of each (stream, boot): the carrier of prevShutdown. */
function bootRecords(ordered: readonly UnitEvent[]): Map<string, { record: PowerEvent; index: number }> {
  const records = new Map<string, { record: PowerEvent; index: number }>();
  ordered.forEach((e, index) => {
    const key = `${e.stream}/${e.boot}`;
    if (e.kind === 'power' && e.event === 'boot' && !records.has(key)) records.set(key, { record: e, index });
  });
  return records;
}

/**
 * Finds every key-off (key on -> off within one boot of one stream, protocol rule 1) in the ordered,
 * de-duplicated events and settles it by protocol rules 2 to 7. Episodes come out in key-off order.
 */
export function judgeEpisodes(ordered: readonly UnitEvent[], input: JudgeInput): JudgedEpisode[] {
  const records = bootRecords(ordered);
  const judged: JudgedEpisode[] = [];
  let lastAmbient = input.context?.lastAmbient ?? null;
  let previousSample = -1;
  ordered.forEach((e, index) => {
    if (e.kind !== 'telemetry') return;
    const prev = previousSample >= 0 ? ordered[previousSample] : null;
    if (e.key === 'off' && prev?.kind === 'telemetry' && prev.key === 'on' && sameBoot(prev, e)) {
      const near = lastAmbient && e.ts - lastAmbient.ts <= AMBIENT_LOOKBACK_MS ? lastAmbient.ambientC : null;
      judged.push(judgeOne(ordered, previousSample, index, e.ambientC ?? near, input, records));
    }
    previousSample = index;
    if (e.ambientC !== null) lastAmbient = { ts: e.ts, ambientC: e.ambientC };
  });
  return judged;
}

function judgeOne(
  ordered: readonly UnitEvent[],
  anchorIndex: number,
  keyOffIndex: number,
  ambientC: number | null,
  input: JudgeInput,
  records: Map<string, { record: PowerEvent; index: number }>,
): JudgedEpisode {
  const keyOff = ordered[keyOffIndex];
  const profile = profileFor(positionKey(keyOff), input.profile, input.previousEpisodes);
  const clock = { keyOffTs: keyOff.ts, c: keyOff.ts + profile.purgeSeconds * 1000, lossThresholdV: profile.lossThresholdV };
  // Protocol rule 3: the same boot first; the next boot's record (boot + 1 only) where it gave no evidence.
  let settlement = settleFromSameBoot(ordered, anchorIndex, keyOffIndex, clock);
  const next = records.get(`${keyOff.stream}/${keyOff.boot + 1}`);
  if (!settlement && next) settlement = settleFromBootRecord(next.record, next.index, clock);
  const episode: Episode = {
    keyOff: { ...positionOf(keyOff), ts: keyOff.ts },
    purgeSeconds: profile.purgeSeconds,
    lossThresholdV: profile.lossThresholdV,
    // Protocol rule 6: pending until C + 30 s, then undetermined.
    outcome: settlement?.outcome ?? (input.now < clock.c + SETTLE_GRACE_MS ? 'pending' : 'undetermined'),
    settledBy: settlement?.settledBy ?? null,
    endedAt: settlement?.endedAt ?? null,
    secondsIntoPurge: settlement?.secondsIntoPurge ?? null,
    ambientC,
    evidence: settlement?.evidence ?? null,
    final: settlement?.final ?? false,
    minAmbientAfterC: null,
    freezeExposure: null,
    nextKeyOnAt: null,
  };
  return { episode, anchorIndex, keyOffIndex, evidenceIndex: settlement?.evidenceIndex ?? null };
}
