// Every unit's memory, loaded lazily or at start-up from the database, and what the API reads of it.
import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import type { Logger } from 'pino';
import { Unit } from '../db/models/unit';
import { Dm1Tracker } from '../../shared/j1939/dm1-tracker';
import { KEY_ON_SILENCE_MS, SAFE_SILENCE_MS, SETTLE_GRACE_MS } from '../../shared/protocol/limits';
import { judgeInternals, judgementOf } from '../detection/judge-unit';
import { stillWet } from '../detection/freeze';
import { comparePositions, orderEvents, positionKey, positionOf } from '../detection/positions';
import type { JudgeInput } from '../detection/types';
import { emptyLiveUnitView, type LiveUnitView } from '../lib/context';
import { latestEpisodes, loadDm1State, loadEvents } from './episode-store';
import { newMemory, unitNow, type UnitMemory, type UnitProfile } from './unit-memory';

// A unit's view is made after each commit that judged it and again for the board's push, and its times
// change far less often than that (stateSince rarely, lastSeenAt once per message): the last texts made
// are kept in a small table by the millisecond's low bits, so most of these are looked up, not formatted.
const ISO_SLOTS = 4096;
const isoMs = new Float64Array(ISO_SLOTS).fill(NaN);
const isoTexts: string[] = new Array(ISO_SLOTS).fill('');
export const isoText = (ms: number | null) => {
  if (ms === null) return null;
  const slot = ms & (ISO_SLOTS - 1);
  if (isoMs[slot] === ms) return isoTexts[slot];
  const text = new Date(ms).toISOString(); // throws for a time that is no date, and nothing is kept
  isoMs[slot] = ms;
  return (isoTexts[slot] = text);
};

export const profileOf = (u: Unit): UnitProfile => ({
  unitId: u.id, depot: u.depot, purgeSeconds: u.purgeSeconds, lossThresholdV: u.lossThresholdV, linkSpns: u.linkSpns,
});

export class UnitBook {
  private units = new Map<string, UnitMemory>();
  private tickedAt = new Map<string, number>();
  /** The fleet's event time: the median of the units' clocks (see clock()). */
  private fleetNow: number | null = null;

  constructor(private sequelize: Sequelize, private wallNow: () => number, private log: Logger) {}

  /**
   * The clock a unit is judged by: its own (event time running on since its last message) or the
   * fleet's, whichever is later. In a fast replay a silent unit's own clock hardly moves, while the
   * rest of the fleet's messages show how far event time has gone; the median keeps one gateway with
   * a wrong clock from moving everyone.
   */
  clock(m: UnitMemory, wall: number): number {
    const own = unitNow(m, wall);
    return this.fleetNow === null ? own : Math.max(own, this.fleetNow + Math.max(0, wall - this.fleetAt));
  }
  private fleetAt = 0;

  /** Recomputes the fleet's clock; called by the ingest's ticker. */
  updateFleetClock(wall: number) {
    // A typed array sorts numbers natively (four times a second over every unit: no comparator calls).
    const clocks = new Float64Array(this.units.size);
    let n = 0;
    for (const m of this.units.values()) if (m.lastTs !== null) clocks[n++] = unitNow(m, wall);
    if (n < 3) {
      this.fleetNow = null;
      return;
    }
    const known = clocks.subarray(0, n).sort();
    this.fleetNow = known[Math.floor(n / 2)];
    this.fleetAt = wall;
  }

  unitIds(): string[] {
    return [...this.units.keys()];
  }

  peek(unitId: string) {
    return this.units.get(unitId);
  }

  /** Drops a unit's memory: it is rebuilt from the database when next needed. */
  forget(unitId: string) {
    this.units.delete(unitId);
  }

  set(unitId: string, m: UnitMemory) {
    this.units.set(unitId, m);
  }

  async get(unitId: string, t?: Transaction): Promise<UnitMemory | null> {
    const m = this.units.get(unitId);
    if (m) return m;
    const unit = await Unit.findByPk(unitId, { transaction: t });
    if (!unit) return null;
    const rebuilt = await this.rebuild(profileOf(unit), t);
    this.units.set(unitId, rebuilt);
    return rebuilt;
  }

  async loadAll() {
    for (const unit of await Unit.findAll()) {
      try {
        this.units.set(unit.id, await this.rebuild(profileOf(unit)));
      } catch (err) {
        this.log.error({ err, unitId: unit.id }, 'could not rebuild a unit from the database');
      }
    }
  }

  /** After a profile change: new purges use the new profile; stored episodes keep theirs. */
  async refreshProfile(unitId: string) {
    const unit = await Unit.findByPk(unitId);
    if (!unit) return;
    const m = this.units.get(unitId);
    if (m) m.profile = profileOf(unit);
    else await this.get(unitId);
  }

  /**
   * Rebuilds a unit's memory: its episodes that are not final (or the latest one) and the events from there
   * on; before them, the interrupted episodes whose lines are still wet, carried with their stored freeze
   * figures (window.ts).
   */
  async rebuild(profile: UnitProfile, t?: Transaction): Promise<UnitMemory> {
    const m = newMemory(profile, this.wallNow());
    const [v] = await this.sequelize.query<{ judged_version: string }>(`SELECT judged_version FROM units WHERE id = $1`, { bind: [profile.unitId], type: QueryTypes.SELECT, transaction: t });
    m.version = Number(v?.judged_version ?? 0);
    const recent = (await latestEpisodes(this.sequelize, profile.unitId, 50, t)).reverse();
    let anchor = recent.length ? recent[recent.length - 1] : null;
    for (const s of recent) if (!s.episode.final && (!anchor || comparePositions(s.episode.keyOff, anchor.episode.keyOff) < 0)) anchor = s;
    const from = anchor ? anchor.episode.keyOff : null;
    const tail = await loadEvents(this.sequelize, profile.unitId, { from, beforeTail: from ? 3 : 20 }, t);
    const rest = from ? await loadEvents(this.sequelize, profile.unitId, { from }, t) : [];
    const rows = [...tail, ...rest];
    if (rows.length === 0) return m;
    for (const r of rows) {
      if (m.lastTs === null || r.event.ts > m.lastTs) {
        m.lastTs = r.event.ts;
        m.lastArrival = r.receivedAt;
      }
      const e = r.event;
      if (e.kind === 'telemetry') m.lastTelemetry = { position: { stream: e.stream, boot: e.boot, seq: e.seq }, supplyV: e.supplyV, ambientC: e.ambientC };
    }
    const events = orderEvents(rows.map((r) => r.event));
    const first = events[0];
    // Carried, not judged again: the still-wet episodes before the loaded events.
    const wet = stillWet(recent.filter((s) => comparePositions(s.episode.keyOff, first) < 0), (s) => s.episode);
    for (const s of recent) if (!from || comparePositions(s.episode.keyOff, from) >= 0 || wet.includes(s)) m.episodes.set(positionKey(s.episode.keyOff), s);
    const input: JudgeInput = {
      profile: { purgeSeconds: profile.purgeSeconds, lossThresholdV: profile.lossThresholdV },
      events,
      previousEpisodes: [...m.episodes.values()].map((s) => s.episode),
      now: this.clock(m, this.wallNow()),
      context: wet.length ? { state: null, lastAmbient: null, wet: wet.map((s) => s.episode) } : null,
    };
    // Only the state: the window is set below, so the judgement's own window is not worked out.
    m.state = judgementOf(input, judgeInternals(input, { validate: false })).state;
    // The window starts at the loaded events, not where this judgement would move it: the events may settle a
    // stored episode differently from its row (behind an external broker a rebuild happens inside a batch
    // whose own messages are among them), and only the next judgement, which compares with the stored
    // episodes, writes that change. Moved on here, the episode would drop out of memory with its row unchanged.
    m.windowStart = positionOf(first);
    m.events = events;
    m.context = input.context ?? null;
    const dm1 = await loadDm1State(this.sequelize, profile.unitId);
    if (dm1) {
      m.dm1 = Dm1Tracker.restore(dm1.snapshot);
      m.lastCan = dm1.last;
    }
    return m;
  }

  /** When the unit's open (pending) purge ends (C), if it has one: what its countdown counts to. */
  purgeEndsAt(unitId: string): number | null {
    const m = this.units.get(unitId);
    return m ? this.openC(m) : null;
  }

  /** The open (pending) episode's purge end C, if any. */
  private openC(m: UnitMemory): number | null {
    let c: number | null = null;
    for (const { episode: e } of m.episodes.values()) {
      if (e.outcome !== 'pending') continue;
      const end = e.keyOff.ts + e.purgeSeconds * 1000;
      c = c === null ? end : Math.max(c, end);
    }
    return c;
  }

  /** Units whose next time rule (C + 30 s, a silence limit) has come due by the unit's clock. */
  dueUnits(wall: number): string[] {
    const due: string[] = [];
    for (const [unitId, m] of this.units) {
      const c = this.openC(m);
      let deadline: number | null = c !== null ? c + SETTLE_GRACE_MS : null;
      if (m.lastTs !== null && m.state?.state === 'keyOn') deadline = Math.min(deadline ?? Infinity, m.lastTs + KEY_ON_SILENCE_MS);
      if (m.lastTs !== null && m.state?.state === 'safeToIsolate') deadline = Math.min(deadline ?? Infinity, m.lastTs + SAFE_SILENCE_MS);
      if (deadline === null || this.clock(m, wall) < deadline) continue;
      if (this.tickedAt.get(unitId) === deadline) continue;
      this.tickedAt.set(unitId, deadline);
      due.push(unitId);
    }
    return due;
  }

  view(unitId: string): LiveUnitView {
    const m = this.units.get(unitId);
    if (!m) return emptyLiveUnitView;
    const c = this.openC(m);
    const now = this.clock(m, this.wallNow());
    const remaining = m.state?.state === 'purging' && c !== null ? Math.max(0, Math.ceil((c - now) / 1000)) : null;
    return {
      state: m.state?.state ?? null,
      stateSince: isoText(m.state?.since ?? null),
      purgeRemainingS: remaining,
      lastSupplyV: m.lastTelemetry?.supplyV ?? null,
      lastAmbientC: m.lastTelemetry?.ambientC ?? null,
      lastSeenAt: isoText(m.lastTs),
    };
  }
}
