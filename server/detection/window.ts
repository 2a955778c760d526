import type { EventPosition, JudgeContext, JudgeInput, Judgement } from './types';
import { positionOf } from './positions';
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
 * filled a gap before it). Episodes before `start` are final or past the hold limit: leave them alone.
 *
 * `start` is the earliest of: the key-on sample before the key-off of every episode that can still
 * change (not final; or interrupted with no later completed purge, whose freeze figures and next key-on
 * are still open), unless past the hold limit; the last telemetry sample (a new key-off needs the sample
 * before it); the last event (silence is measured from it). It never falls between an episode's key-on
 * sample and its key-off, so a kept key-off always keeps the sample that makes it one.
 *
 * A message that arrives before `start` cannot change a final episode or the current state. It can
 * reveal a key-off in an old gap: store it, and to judge that stretch load its boot's events from the
 * database, judge them with no context, and upsert only the returned episodes that lie before `start`.
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

function windowOf(input: JudgeInput, { ordered, judged }: JudgedUnit, holdLimit?: number): JudgingWindow {
  const holdLimitMs = holdLimit ?? DEFAULT_HOLD_LIMIT_MS;
  if (!Number.isFinite(holdLimitMs) || holdLimitMs < 0) throw new RangeError(`holdLimitMs must be a finite ms >= 0, got ${holdLimitMs}`);
  const carried: JudgeContext = input.context ?? { state: null, lastAmbient: null };
  if (ordered.length === 0) return { start: null, context: carried };

  let start = ordered.length - 1;
  for (let i = ordered.length - 1; i >= 0; i--) {
    if (ordered[i].kind === 'telemetry') {
      start = Math.min(start, i);
      break;
    }
  }
  judged.forEach((j, n) => {
    const e = j.episode;
    const c = e.keyOff.ts + e.purgeSeconds * 1000;
    const freezeOpen = e.outcome === 'interrupted' && !judged.slice(n + 1).some((l) => l.episode.outcome === 'completed');
    const expired = input.now - c > holdLimitMs;
    if ((!e.final || freezeOpen) && !expired) start = Math.min(start, j.anchorIndex);
  });
  const straddled = judged.find((j) => j.anchorIndex < start && start <= j.keyOffIndex);
  if (straddled) start = straddled.anchorIndex;

  const fold = foldEvents(ordered, judged, input.profile.lossThresholdV, initialFold(input), 0, start, input.now);
  let lastAmbient = carried.lastAmbient;
  for (let i = 0; i < start; i++) {
    const e = ordered[i];
    if (e.kind === 'telemetry' && e.ambientC !== null) lastAmbient = { ts: e.ts, ambientC: e.ambientC };
  }
  return { start: positionOf(ordered[start]), context: { state: closeFold(fold, input.now), lastAmbient } };
}
