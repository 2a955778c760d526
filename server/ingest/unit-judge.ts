// Re-judges one unit inside the batch's transaction: merges new events into its window and returns the
// episodes that changed (written in bulk for the whole batch by batch-writes.ts) and the unit's next
// memory (swapped in after commit). It only reads the database, so a unit that fails leaves no trace.
import type { Sequelize, Transaction } from 'sequelize';
import { judgeUnit } from '../detection/judge-unit';
import { judgeWithWindow, type JudgingWindow } from '../detection/window';
import { foldLateFreezeExposure, mergeFreezeExposure } from '../detection/freeze';
import { comparePositions, orderEvents, positionKey } from '../detection/positions';
import type { Episode, JudgeInput, UnitEvent } from '../detection/types';
import { applyWindow, cloneMemory, type StoredEpisode, type UnitMemory } from './unit-memory';
import { loadBootEvents, loadEpisodes } from './episode-store';

export interface JudgeResult {
  memory: UnitMemory;
  /** Episodes inserted or changed; a new one has id 0 until the batch's upsert gives it one. */
  changed: StoredEpisode[];
  /** Stored episodes that are no longer key-offs. */
  deleted: number[];
  /** Changed episodes' previous versions (for fault relinking and alerts). */
  before: Map<string, Episode>;
}

const same = (a: Episode, b: Episode) => JSON.stringify(a) === JSON.stringify(b);

type Write = (episodes: Episode[], stored: Map<string, StoredEpisode>) => void;

/** Puts the judged episodes that differ from the stored ones into `stored` and `changed`, remembering what they were. */
function writeChanged(episodes: Episode[], stored: Map<string, StoredEpisode>, changed: StoredEpisode[], previousVersions: Map<string, Episode>) {
  for (const e of episodes) {
    const key = positionKey(e.keyOff);
    const old = stored.get(key);
    if (old && same(old.episode, e)) continue;
    if (old) previousVersions.set(key, old.episode);
    // The same object sits in the memory and in `changed`: the batch's upsert fills in a new id.
    const entry = { id: old?.id ?? 0, episode: e };
    stored.set(key, entry);
    changed.push(entry);
  }
}

export async function judgeUnitInBatch(
  sequelize: Sequelize,
  t: Transaction,
  current: UnitMemory,
  fresh: { event: UnitEvent; receivedAt: number }[],
  clock: (m: UnitMemory) => number,
): Promise<JudgeResult> {
  const m = cloneMemory(current);
  const unitId = m.profile.unitId;
  for (const { event, receivedAt } of fresh) {
    if (m.lastTs === null || event.ts > m.lastTs) {
      m.lastTs = event.ts;
      m.lastArrival = receivedAt;
    }
    if (event.kind === 'telemetry' && (!m.lastTelemetry || comparePositions(event, m.lastTelemetry.position) > 0)) {
      m.lastTelemetry = { position: { stream: event.stream, boot: event.boot, seq: event.seq }, supplyV: event.supplyV, ambientC: event.ambientC };
    }
  }
  const start = m.windowStart;
  const inWindow = fresh.filter((f) => !start || comparePositions(f.event, start) >= 0).map((f) => f.event);
  const before = fresh.filter((f) => start && comparePositions(f.event, start) < 0).map((f) => f.event);
  const changed: StoredEpisode[] = [];
  const deleted: number[] = [];
  const previousVersions = new Map<string, Episode>();

  // Late messages before the window after a carried wet episode's key-off: their readings count in its freeze figures.
  if (before.length && m.context?.wet) m.context = { ...m.context, wet: foldLateFreezeExposure(m.context.wet, before) };
  const now = clock(m);
  const input: JudgeInput = {
    profile: { purgeSeconds: m.profile.purgeSeconds, lossThresholdV: m.profile.lossThresholdV },
    events: orderEvents([...m.events, ...inWindow]),
    previousEpisodes: [...m.episodes.values()].map((s) => s.episode),
    now,
    context: m.context,
  };
  const { judgement, window: judged } = judgeWithWindow(input, { validate: false });
  let win = judged;
  const returned = new Set(judgement.episodes.map((e) => positionKey(e.keyOff)));
  // A stored episode in the window whose key-off is no longer one (a late message filled a gap before it).
  const gone = [...m.episodes.values()].filter((s) => !returned.has(positionKey(s.episode.keyOff)));
  for (const g of gone) {
    if (g.id) deleted.push(g.id);
    m.episodes.delete(positionKey(g.episode.keyOff));
  }
  writeChanged(judgement.episodes, m.episodes, changed, previousVersions);
  m.state = judgement.state;

  // Messages from before the window: judge their boots afresh from the database (window.ts explains why).
  if (before.length) win = await judgeOldStretch(sequelize, t, m, win, before, now, (episodes, stored) => writeChanged(episodes, stored, changed, previousVersions), deleted);

  applyWindow(m, win, input.events);
  return { memory: m, changed, deleted, before: previousVersions };
}

/** Returns the window with any carried wet episode closed by a completed purge the old stretch revealed. */
async function judgeOldStretch(
  sequelize: Sequelize,
  t: Transaction,
  m: UnitMemory,
  win: JudgingWindow,
  late: UnitEvent[],
  now: number,
  write: Write,
  deleted: number[],
): Promise<JudgingWindow> {
  const unitId = m.profile.unitId;
  let wet = win.context.wet ?? [];
  const boots = new Map<string, { stream: number; boot: number }>();
  for (const e of late) boots.set(`${e.stream}/${e.boot}`, { stream: e.stream, boot: e.boot });
  for (const { stream, boot } of boots.values()) {
    // The boot's own events and the next boot's first messages (its boot record).
    const events = (await loadBootEvents(sequelize, unitId, stream, boot, t)).map((r) => r.event);
    const stored = new Map((await loadEpisodes(sequelize, unitId, { stream, boot, seq: 0 }, t)).filter((s) => s.episode.keyOff.boot === boot).map((s) => [positionKey(s.episode.keyOff), s]));
    const j = judgeUnit({
      profile: { purgeSeconds: m.profile.purgeSeconds, lossThresholdV: m.profile.lossThresholdV },
      events,
      previousEpisodes: [...stored.values()].map((s) => s.episode),
      now,
      context: null,
    });
    const before = (p: Episode['keyOff']) => p.boot === boot && (!m.windowStart || comparePositions(p, m.windowStart) < 0);
    const outside = j.episodes.filter((e) => before(e.keyOff));
    // As in the window: a stored key-off of this stretch that is no longer one goes.
    const kept = new Set(outside.map((e) => positionKey(e.keyOff)));
    const gone = [...stored.values()].filter((s) => before(s.episode.keyOff) && !kept.has(positionKey(s.episode.keyOff)));
    deleted.push(...gone.map((g) => g.id));
    // One boot shows only part of an episode's freeze figures (window.ts): a carried wet episode keeps its own
    // (the late readings are folded in already), another interrupted one takes the union with the stored ones.
    const carried = new Set(wet.map((w) => positionKey(w.keyOff)));
    const partial = outside.filter((e) => !carried.has(positionKey(e.keyOff)));
    write(partial.map((e) => { const s = stored.get(positionKey(e.keyOff)); return s ? mergeFreezeExposure(e, s.episode) : e; }), stored);
    const completed = outside.filter((e) => e.outcome === 'completed');
    wet = wet.filter((w) => !completed.some((c) => comparePositions(c.keyOff, w.keyOff) > 0));
  }
  const context = { ...win.context };
  if (wet.length) context.wet = wet;
  else delete context.wet;
  return { ...win, context };
}
