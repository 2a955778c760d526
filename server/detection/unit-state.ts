import { KEY_ON_SILENCE_MS, SAFE_SILENCE_MS, SETTLE_GRACE_MS } from '../../shared/protocol/limits';
import type { BaseState, Episode, UnitEvent, UnitState } from './types';
import type { JudgedEpisode } from './judge-episodes';

/** The fold's value: a base state, or an episode between its key-off and its settling message. */
export interface Fold {
  base: BaseState | null;
  open: JudgedEpisode | null;
}

const at = (name: BaseState['name'], since: number): BaseState => ({ name, since });

/** What a settled episode leaves behind (protocol rule 8); an unsettled one, read at `now`. */
export function settledBase(episode: Episode, now: number): BaseState | null {
  const c = episode.keyOff.ts + episode.purgeSeconds * 1000;
  switch (episode.outcome) {
    case 'completed':
      return at('safeToIsolate', episode.endedAt as number);
    case 'interrupted':
      return at('interrupted', episode.endedAt as number);
    case 'resumed':
      return at('keyOn', episode.endedAt as number);
    case 'undetermined':
      return at('undetermined', c + SETTLE_GRACE_MS);
    case 'pending':
      return now >= c + SETTLE_GRACE_MS ? at('undetermined', c + SETTLE_GRACE_MS) : null;
  }
}

function isLoss(e: UnitEvent, thresholdV: number): boolean {
  if (e.kind === 'power') return e.event === 'supply-lost' || e.supplyV < thresholdV;
  return e.kind === 'telemetry' && e.supplyV < thresholdV;
}

/**
 * One message outside any open purge. Choices beyond rule 8, documented for the ingest:
 * - key off with no judged purge (the first message, or a new boot that starts with the key off):
 *   safeToIsolate when the controller is asleep (no purge can be running), otherwise offUnknown
 *   (shown as noContact: nothing is claimed until the controller is seen asleep);
 * - supply lost while the key is on, or with no purge open, is isolated; supply back after isolated
 *   (a sample at or above the threshold, supply-restored, or a boot) is safeToIsolate;
 * - interrupted and undetermined hold until the next key-on, whatever the supply does.
 */
export function step(base: BaseState | null, e: UnitEvent, thresholdV: number): BaseState | null {
  if (e.kind === 'can') return base;
  const name = base?.name ?? null;
  const loss = isLoss(e, thresholdV);
  if (e.kind === 'telemetry' && e.key === 'on' && !loss) return name === 'keyOn' ? base : at('keyOn', e.ts);
  if (name === 'interrupted' || name === 'undetermined') return base;
  if (loss) return name === 'isolated' ? base : at('isolated', e.ts);
  if (e.kind === 'power') {
    const back = e.event !== 'supply-lost' && name === 'isolated';
    return back ? at('safeToIsolate', e.ts) : base;
  }
  // A key-off sample with supply held.
  if (name === 'isolated') return at('safeToIsolate', e.ts);
  if (name === 'safeToIsolate') return base;
  if (!e.ecmAwake) return at('safeToIsolate', e.ts);
  return name === 'offUnknown' ? base : at('offUnknown', e.ts);
}

/**
 * Folds the ordered events [from, to) into the unit's state, given the judged episodes of the same
 * events and the current profile's loss threshold (for supply readings outside a purge).
 */
export function foldEvents(
  ordered: readonly UnitEvent[],
  judged: readonly JudgedEpisode[],
  thresholdV: number,
  initial: Fold,
  from: number,
  to: number,
  now: number,
): Fold {
  const byKeyOff = new Map(judged.map((j) => [j.keyOffIndex, j]));
  let { base, open } = initial;
  for (let i = from; i < to; i++) {
    const e = ordered[i];
    const starting = byKeyOff.get(i);
    if (starting) {
      open = starting;
      continue;
    }
    if (open) {
      if (open.evidenceIndex === i) {
        base = settledBase(open.episode, now);
        open = null;
      } else if (e.kind === 'telemetry' && e.key === 'on') {
        // A later boot's key-on ends an unsettled episode's hold on the state (it never settles it).
        base = settledBase(open.episode, now);
        open = null;
      } else continue;
    }
    base = step(base, e, thresholdV);
  }
  return { base, open };
}

/** Closes an open episode at a cut (window.ts) or at the end: its settled or time-read base. */
export function closeFold(fold: Fold, now: number): BaseState | null {
  return fold.open ? settledBase(fold.open.episode, now) : fold.base;
}

/** When contact counts as lost: `limit` after the last event, if that much silence has passed. */
function silenceSince(lastEventTs: number | null, now: number, limit: number) {
  return lastEventTs !== null && now - lastEventTs >= limit ? lastEventTs + limit : null;
}

const state = (name: UnitState['state'], since: number): UnitState => ({ state: name, since, purgeRemainingS: null });

/** Protocol rule 8 at `now`, after the fold. */
export function finishState(fold: Fold, lastEventTs: number | null, now: number): UnitState | null {
  const open = fold.open?.episode;
  if (open && open.outcome === 'pending') {
    const c = open.keyOff.ts + open.purgeSeconds * 1000;
    if (now < c + SETTLE_GRACE_MS) {
      return { state: 'purging', since: open.keyOff.ts, purgeRemainingS: Math.max(0, Math.ceil((c - now) / 1000)) };
    }
  }
  const base = closeFold(fold, now);
  if (!base) return null;
  switch (base.name) {
    case 'keyOn': {
      const lost = silenceSince(lastEventTs, now, KEY_ON_SILENCE_MS);
      return lost === null ? state('keyOn', base.since) : state('noContact', lost);
    }
    case 'safeToIsolate': {
      const lost = silenceSince(lastEventTs, now, SAFE_SILENCE_MS);
      return lost === null ? state('safeToIsolate', base.since) : state('noContact', lost);
    }
    case 'undetermined':
    case 'offUnknown':
      return state('noContact', base.since);
    default:
      return state(base.name, base.since);
  }
}
