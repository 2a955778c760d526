// Faults of one unit in a batch: DM1 frames through the unit's tracker (protocol rule 9), then the
// links to interrupted purges (rule 10), all inside the batch's transaction.
import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import { Dm1Tracker, type FaultActivation, type TrackerFrame } from '../../shared/j1939/dm1-tracker';
import { comparePositions } from '../detection/positions';
import { linkFaults } from '../detection/link-faults';
import { FAULT_LINK_WINDOW_MS } from '../../shared/protocol/limits';
import type { Episode, EventPosition } from '../detection/types';
import type { CanFrame } from '../../shared/protocol/messages';
import { episodeFromRow, loadEvents } from './episode-store';
import type { UnitMemory } from './unit-memory';

export interface CanInput {
  position: EventPosition;
  frames: CanFrame[];
}

const toTracker = (frames: CanFrame[]): TrackerFrame[] => frames.map((f) => ({ t: Date.parse(f.t), id: f.id, data: f.data }));

export interface CanOutcome {
  activations: FaultActivation[];
  /** The unit's faults were recomputed from its whole CAN history: replace them all. */
  recomputed: boolean;
  /** The tracker's state to save, when CAN messages came in. */
  dm1: { snapshot: unknown; last: EventPosition } | null;
}

/** Feeds new CAN messages to the tracker; one that arrives before the last fed one makes the unit's faults be recomputed from its whole CAN history. Reads only. */
export async function judgeCan(sequelize: Sequelize, t: Transaction, m: UnitMemory, can: CanInput[]): Promise<CanOutcome> {
  if (!can.length) return { activations: [], recomputed: false, dm1: null };
  const unitId = m.profile.unitId;
  const ordered = can.slice().sort((a, b) => comparePositions(a.position, b.position));
  const inOrder = !m.lastCan || comparePositions(ordered[0].position, m.lastCan) > 0;
  const activations: FaultActivation[] = [];
  if (inOrder) {
    m.dm1 = Dm1Tracker.restore(m.dm1.snapshot()); // copy on write: the committed memory keeps its own
    for (const c of ordered) activations.push(...m.dm1.pushAll(toTracker(c.frames)).activations);
    m.lastCan = ordered[ordered.length - 1].position;
  } else {
    const all = await loadEvents(sequelize, unitId, { kinds: ['can'] }, t);
    const tracker = new Dm1Tracker();
    for (const r of all) activations.push(...tracker.pushAll(toTracker(r.frames ?? [])).activations);
    m.dm1 = tracker;
    const last = all[all.length - 1].event;
    m.lastCan = { stream: last.stream, boot: last.boot, seq: last.seq };
  }
  return { activations, recomputed: !inOrder, dm1: { snapshot: m.dm1.snapshot(), last: m.lastCan! } };
}

/** Relinks the unit's faults whose time lies in [from, to] to the interrupted episodes that explain them. */
export async function relinkFaults(sequelize: Sequelize, t: Transaction, m: UnitMemory, from: number, to: number): Promise<number> {
  const unitId = m.profile.unitId;
  const faults = await sequelize.query<{ id: string; at: Date; spn: number; episode_id: string | null }>(
    `SELECT id, at, spn, episode_id FROM faults WHERE unit_id = $1 AND at BETWEEN $2 AND $3`,
    { bind: [unitId, new Date(from).toISOString(), new Date(to).toISOString()], type: QueryTypes.SELECT, transaction: t },
  );
  if (!faults.length) return 0;
  const rows = await sequelize.query<Parameters<typeof episodeFromRow>[0]>(
    `SELECT * FROM episodes WHERE unit_id = $1 AND outcome = 'interrupted' AND next_key_on_at BETWEEN $2 AND $3`,
    { bind: [unitId, new Date(from - FAULT_LINK_WINDOW_MS).toISOString(), new Date(to).toISOString()], type: QueryTypes.SELECT, transaction: t },
  );
  const episodes = rows.map(episodeFromRow);
  const links = linkFaults(episodes.map((e) => e.episode), faults.map((f) => ({ at: f.at.getTime(), spn: f.spn })), m.profile.linkSpns);
  const updates = faults
    .map((f, i) => ({ id: Number(f.id), episodeId: links[i] === null ? null : episodes[links[i]!].id, was: f.episode_id === null ? null : Number(f.episode_id) }))
    .filter((u) => u.episodeId !== u.was);
  if (updates.length) {
    await sequelize.query(
      `UPDATE faults f SET episode_id = x.episode_id FROM jsonb_to_recordset($1::jsonb) AS x(id bigint, episode_id bigint) WHERE f.id = x.id`,
      { bind: [JSON.stringify(updates.map((u) => ({ id: u.id, episode_id: u.episodeId })))], transaction: t },
    );
  }
  return updates.length;
}

/** The time span whose links an episode's change can affect: from its first key-on after the loss to 10 min later. */
export function linkSpan(e: Episode | undefined): [number, number] | null {
  if (!e || e.outcome !== 'interrupted' || e.nextKeyOnAt === null) return null;
  return [e.nextKeyOnAt, e.nextKeyOnAt + FAULT_LINK_WINDOW_MS];
}

