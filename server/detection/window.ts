import type { Episode, EventPosition, JudgeContext, JudgeInput, Judgement } from './types';
import { positionOf } from './positions';
import { stillWet } from './freeze';
import { initialFold, judgeInternals, judgementOf, type JudgedUnit } from './judge-unit';
import { closeFold, foldEvents } from './unit-state';

/**
 * How long an episode that could still change may hold the window: a week covers a gateway that was
 * off the network for a long weekend and then uploads its buffer (a design choice). After that, late
 * messages for it are treated as the shell treats any message before the window (see below).
 */
export const DEFAULT_HOLD_LIMIT_MS = 7 * 24 * 60 * 60_000;

export interface JudgingWindow {
  /** The first event to keep; null when there are no events (keep nothing, carry the context). */
  start: EventPosition | null;
  /** Pass back as `context` with the kept events when judging next. */
  context: JudgeContext;
}

/**
 * Where the next judgement may start, so the ingest shell need not re-judge a unit's whole history.
 *
 * The shell keeps, per unit: every event with position >= `start` (including ones that arrive later
 * into gaps after it), and `context`. Next time it calls judgeUnit with exactly those events (plus the
 * new ones), `context`, the same profile, and the stored episodes as previousEpisodes. The judgement
 * then holds every episode with key-off >= start; the shell upserts them by keyOff position, and deletes
 * a stored episode with key-off >= start that is no longer returned (its key-off moved: a late message
 * filled a gap before it). Episodes before `start` are final or past the hold limit: leave them alone,
 * but for the still-wet ones carried in the context (below).
 *
 * `start` is the earliest of: the key-on sample before the key-off of every episode that is not final,
 * unless past the hold limit; the last telemetry sample (a new key-off needs the sample before it); the
 * last event (silence is measured from it). It never falls between an episode's key-on sample and its
 * key-off, so a kept key-off always keeps the sample that makes it one.
 *
 * An interrupted episode whose lines are still wet (no completed purge after it yet) has freeze figures
 * and a next key-on still open, however final it is. It does not hold the window: it travels in
 * `context.wet` with its figures so far, each judgement folds the new samples into it and returns it
 * among the episodes (upsert it like the others, and keep it as a stored episode while it is carried).
 * It leaves the context once a completed purge after it lies before `start`, or past the hold limit.
 * So a unit that was isolated mid-purge and then drives all day holds a handful of events, not the day.
 *
 * A message that arrives before `start` cannot change a final episode or the current state. It can
 * reveal a key-off in an old gap: store it, and to judge that stretch load its boot's events from the
 * database, judge them with no context, and upsert only the returned episodes that lie before `start`.
 * Such a stretch shows only part of the freeze figures: fold the late messages into the carried wet
 * episodes first (foldLateFreezeExposure) and keep those as they are; for another interrupted episode
 * take the union of the stretch's figures and the stored ones (mergeFreezeExposure). A completed purge
 * revealed there after a carried episode's key-off closes it (drop it from `context.wet`); its figures
 * may then include samples after that purge, so they err on the cold side.
 */
export function judgingWindow(input: JudgeInput, options: { holdLimitMs?: number } = {}): JudgingWindow {
  return windowOf(input, judgeInternals(input), options.holdLimitMs);
}

/**
 * judgeUnit and judgingWindow of the same input in one pass over it (what the ingest shell does after
 * every batch). `validate: false` skips the input check, for input built from already-checked messages.
 */
export function judgeWithWindow(input: JudgeInput, options: { holdLimitMs?: number; validate?: boolean } = {}): { judgement: Judgement; window: JudgingWindow } {
  const internals = judgeInternals(input, { validate: options.validate });
  return { judgement: judgementOf(input, internals), window: windowOf(input, internals, options.holdLimitMs) };
}

/**
 * An episode whose purge ended more than the hold limit ago (by the unit's clock): the window no longer holds it.
 * A module function, not a closure made in windowOf: that runs for every unit of every batch, and under the
 * loader each closure made there also cost a defineProperty (it keeps functions' names).
 */
function heldTooLong(e: Episode, now: number, holdLimitMs: number): boolean {
  return now - (e.keyOff.ts + e.purgeSeconds * 1000) > holdLimitMs;
}

function windowOf(input: JudgeInput, { ordered, judged, carried }: JudgedUnit, holdLimit?: number): JudgingWindow {
  const holdLimitMs = holdLimit ?? DEFAULT_HOLD_LIMIT_MS;
  if (!Number.isFinite(holdLimitMs) || holdLimitMs < 0) throw new RangeError(`holdLimitMs must be a finite ms >= 0, got ${holdLimitMs}`);
  const given: JudgeContext = input.context ?? { state: null, lastAmbient: null };
  if (ordered.length === 0) return { start: null, context: given };

  let start = ordered.length - 1;
  for (let i = ordered.length - 1; i >= 0; i--) {
    if (ordered[i].kind === 'telemetry') {
      start = Math.min(start, i);
      break;
    }
  }
  for (const j of judged) if (!j.episode.final && !heldTooLong(j.episode, input.now, holdLimitMs)) start = Math.min(start, j.anchorIndex);
  const straddled = judged.find((j) => j.anchorIndex < start && start <= j.keyOffIndex);
  if (straddled) start = straddled.anchorIndex;

  const fold = foldEvents(ordered, judged, input.profile.lossThresholdV, initialFold(input), 0, start, input.now);
  let lastAmbient = given.lastAmbient;
  for (let i = 0; i < start; i++) {
    const e = ordered[i];
    if (e.kind === 'telemetry' && e.ambientC !== null) lastAmbient = { ts: e.ts, ambientC: e.ambientC };
  }
  const context: JudgeContext = { state: closeFold(fold, input.now), lastAmbient };
  // The carried episodes lie before the window's events, so this list is in key-off order.
  const before = [...carried, ...judged.filter((j) => j.keyOffIndex < start).map((j) => j.episode)];
  const wet = stillWet(before, (e) => e).filter((e) => !heldTooLong(e, input.now, holdLimitMs));
  if (wet.length) context.wet = wet;
  return { start: positionOf(ordered[start]), context };
}
