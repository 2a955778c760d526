import type { Episode, JudgeInput, Judgement, UnitEvent } from './types';
import { orderEvents } from './positions';
import { judgeEpisodes, type JudgedEpisode } from './judge-episodes';
import { carryFreezeExposure, fillFreezeExposure } from './freeze';
import { finishState, foldEvents, type Fold } from './unit-state';
import { assertJudgeInput } from './validate-input';

export interface JudgedUnit {
  ordered: UnitEvent[];
  judged: JudgedEpisode[];
  /** The context's still-wet interrupted episodes with the events folded in (they lie before the events). */
  carried: Episode[];
}

/** The shared first half of judging: validate, order and de-duplicate, find and settle the episodes. */
export function judgeInternals(input: JudgeInput, options: { validate?: boolean } = {}): JudgedUnit {
  // The ingest shell builds its input from messages the shared schemas already checked, and may skip this.
  if (options.validate !== false) assertJudgeInput(input);
  const ordered = orderEvents(input.events);
  const judged = judgeEpisodes(ordered, input);
  fillFreezeExposure(judged, ordered);
  return { ordered, judged, carried: carryFreezeExposure(input.context?.wet ?? [], judged, ordered) };
}

export function initialFold(input: JudgeInput): Fold {
  return { base: input.context?.state ?? null, open: null };
}

/**
 * Judges one unit's events in event time (gateway protocol, "The after-run purge"): every key-off
 * episode among the events, in key-off order, after the context's still-wet episodes (their freeze
 * figures brought up to date), and the unit's state at `now`. Pure: the same input
 * always gives the same judgement. Events may come in any order and with duplicates.
 */
export function judgeUnit(input: JudgeInput): Judgement {
  return judgementOf(input, judgeInternals(input));
}

/** The second half: the unit's state at `now` from the judged episodes. */
export function judgementOf(input: JudgeInput, { ordered, judged, carried }: JudgedUnit): Judgement {
  const fold = foldEvents(ordered, judged, input.profile.lossThresholdV, initialFold(input), 0, ordered.length, input.now);
  const lastEventTs = ordered.length > 0 ? ordered[ordered.length - 1].ts : null;
  return { episodes: [...carried, ...judged.map((j) => j.episode)], state: finishState(fold, lastEventTs, input.now) };
}
