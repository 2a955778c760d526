// Behind an external broker several workers judge the fleet, each only some units' messages. This relay
// tells the other workers what this one judged (PostgreSQL LISTEN/NOTIFY on one channel, through one
// dedicated connection that comes back after a database restart), and answers this worker's views from
// whichever judgement of a unit is the newer: its own memory or the latest one relayed to it. The alerts
// this worker's live feed pushes go the same way, to the other workers' live feeds.
import { EventEmitter } from 'node:events';
import { randomBytes } from 'node:crypto';
import pg from 'pg';
import type { Logger } from 'pino';
import type { LiveUnitView } from '../lib/context';
import type { FleetEvents } from '../ingest/fleet-events';
import type { UnitBook } from '../ingest/unit-book';
import type { AlertView } from '../../shared/realtime/envelope';
import { AlertStages } from './alert-stages';
import { RELAY_CHANNEL, decodeRelay, encodeAlerts, encodeAsk, encodeRelay, type RelayMessage, type RelayedUnit } from './peer-wire';

/** What other workers changed, for this worker's live feed. */
export interface PeerEvents {
  /** Units whose view (or whose episodes) another worker changed. */
  on(event: 'units' | 'episodes', listener: (unitIds: string[]) => void): this;
  /** An alert another worker pushed on its live feed, in a state this worker's feed has not pushed yet. */
  on(event: 'alert', listener: (alert: AlertView) => void): this;
  /** The relay was deaf for a while: alerts (in the database) may have changed unheard, so clients should re-read. */
  on(event: 'resync', listener: () => void): this;
}

export interface PeerRelayDeps {
  databaseUrl: string;
  workerId: string;
  events: FleetEvents;
  /** The ingest's memory, read only. */
  book: Pick<UnitBook, 'peek' | 'view' | 'unitIds' | 'clock' | 'purgeEndsAt'>;
  /** Reads an alert from the database, for one relayed by id (too large for a notification). */
  loadAlert(id: number): Promise<AlertView>;
  log: Logger;
  wallNow?: () => number;
  /** First pause before reconnecting the listening connection; it doubles up to 5 s (common practice, no published source). */
  retryMs?: number;
}

interface Held extends RelayedUnit {
  /** This worker's wall time that `remainingMs` was measured at. */
  base: number;
}

interface Outgoing extends RelayedUnit {
  snapshot: boolean;
  at: number;
}

/**
 * How far before its receipt a message's send time is believed (transit, a busy event loop); beyond it the
 * other machine's clock is taken to be off. Common practice, no published source.
 */
const MAX_TRANSIT_MS = 2000;

/**
 * After a gap, how long the listening connection must hold before the boards are told to re-read, so that a
 * flapping connection does not make every board reload at each reconnect. Common practice, no published source.
 */
const RESYNC_AFTER_MS = 1000;

export async function startPeerRelay(deps: PeerRelayDeps) {
  const { log, book } = deps;
  const now = deps.wallNow ?? Date.now;
  // The worker id tags the messages; the suffix tells this process from a restarted one of the same id.
  const self = `${deps.workerId}#${randomBytes(4).toString('hex')}`;
  const feed = new EventEmitter() as EventEmitter & PeerEvents;
  const counters = {
    connects: 0, notificationsSent: 0, unitsSent: 0, notificationsReceived: 0, unitsAccepted: 0, unitsOlder: 0, invalid: 0, sendErrors: 0, asksSent: 0, asksAnswered: 0, unitsFromSnapshots: 0,
    alertsSent: 0, alertsAccepted: 0, alertsOlder: 0, alertsLoaded: 0, alertLoadErrors: 0, resyncs: 0,
  };

  const relayed = new Map<string, Held>();
  const outbox = new Map<string, Outgoing>();
  const outEpisodes = new Set<string>();
  /** Alerts this worker published, in order, not yet sent. */
  let outAlerts: AlertView[] = [];
  /** The furthest stage this worker's live feed pushed of each alert (its own alerts and relayed ones). */
  const stages = new AlertStages();
  let alertChain = Promise.resolve();
  let ask = false;
  let client: pg.Client | null = null;
  let sending = false;
  let scheduled = false;
  let closed = false;
  let retryTimer: NodeJS.Timeout | null = null;
  let resyncTimer: NodeJS.Timeout | null = null;
  let attempt = 0;

  /** Milliseconds to the purge's end, read from the judging worker's memory; its view's whole seconds stay the reference. */
  const remainingMsOf = (unitId: string, view: LiveUnitView, wall: number): number | null => {
    if (view.state !== 'purging' || view.purgeRemainingS === null) return null;
    const m = book.peek(unitId);
    const c = book.purgeEndsAt(unitId);
    const exact = m && c !== null ? c - book.clock(m, wall) : null;
    return exact !== null && Math.max(0, Math.ceil(exact / 1000)) === view.purgeRemainingS ? Math.max(0, exact) : view.purgeRemainingS * 1000;
  };

  const outgoing = (unitId: string, depot: string, view: LiveUnitView, at: number, snapshot: boolean): Outgoing | null => {
    const version = book.peek(unitId)?.version;
    if (version === undefined || version <= 0) return null; // nothing judged to order it by
    return { unitId, depot, version, view, remainingMs: remainingMsOf(unitId, view, at), snapshot, at };
  };

  deps.events.on('units', (changes) => {
    const at = now();
    for (const c of changes) {
      const h = relayed.get(c.unitId);
      if (h && h.version <= (book.peek(c.unitId)?.version ?? -1)) relayed.delete(c.unitId); // this worker's own judgement is the newer
      const o = outgoing(c.unitId, c.depot, c.view, at, false);
      if (o) outbox.set(c.unitId, o);
    }
    schedule();
  });
  deps.events.on('episodes', (changes) => {
    for (const c of changes) outEpisodes.add(c.unitId);
    schedule();
  });

  function schedule() {
    if (scheduled || sending || !client || closed) return;
    if (!outbox.size && !outEpisodes.size && !outAlerts.length && !ask) return;
    scheduled = true;
    setImmediate(() => {
      scheduled = false;
      void send();
    });
  }

  /** One query at a time; what piles up meanwhile (or while disconnected) goes in the next, newest per unit. */
  async function send() {
    const c = client;
    if (!c || sending) return;
    sending = true;
    const units = [...outbox.values()];
    const episodes = [...outEpisodes];
    const alerts = outAlerts;
    const asking = ask;
    outbox.clear();
    outEpisodes.clear();
    outAlerts = [];
    ask = false;
    const at = now();
    // Remaining times are restated at the message's own time, so one `at` serves every unit in it.
    const restate = (o: Outgoing): RelayedUnit => ({ unitId: o.unitId, depot: o.depot, version: o.version, view: o.view, remainingMs: o.remainingMs === null ? null : o.remainingMs - (at - o.at) });
    try {
      const payloads = [
        ...(asking ? [encodeAsk(self)] : []),
        ...encodeRelay(self, 'units', at, units.filter((o) => !o.snapshot).map(restate), episodes),
        ...encodeRelay(self, 'snapshot', at, units.filter((o) => o.snapshot).map(restate), []),
        // After the units: a board hears of the episode before the alert about it, as from its own worker.
        ...encodeAlerts(self, alerts),
      ];
      await c.query('SELECT pg_notify($1, p) FROM unnest($2::text[]) AS p', [RELAY_CHANNEL, payloads]);
      counters.notificationsSent += payloads.length;
      counters.unitsSent += units.length;
      counters.alertsSent += alerts.length;
      if (asking) counters.asksSent++;
    } catch (err) {
      counters.sendErrors++;
      log.warn({ err: (err as Error).message, units: units.length, alerts: alerts.length }, 'relay not sent; kept for the next connection');
      for (const o of units) if (!outbox.has(o.unitId)) outbox.set(o.unitId, o);
      for (const id of episodes) outEpisodes.add(id);
      outAlerts = [...alerts, ...outAlerts];
      ask ||= asking;
      // Not at once: a refusal that is not a lost connection would otherwise repeat in a tight loop.
      setTimeout(() => {
        sending = false;
        schedule();
      }, 1000).unref();
      return;
    }
    sending = false;
    schedule();
  }

  function answerAsk() {
    counters.asksAnswered++;
    const at = now();
    for (const unitId of book.unitIds()) {
      if (outbox.has(unitId)) continue; // a fresher change is on its way anyway
      const m = book.peek(unitId);
      const o = m && outgoing(unitId, m.profile.depot, book.view(unitId), at, true);
      if (o) outbox.set(unitId, o);
    }
    schedule();
  }

  function receiveAlerts(alerts: AlertView[], refs: number[]) {
    const show = (a: AlertView) => {
      if (!stages.advance(a)) return void counters.alertsOlder++;
      counters.alertsAccepted++;
      feed.emit('alert', a);
    };
    // One notification after the other, so that an alert read back from the database never overtakes a later state.
    alertChain = alertChain.then(async () => {
      for (const a of alerts) show(a);
      for (const id of refs) {
        let a: AlertView;
        try {
          a = await deps.loadAlert(id);
        } catch (err) {
          counters.alertLoadErrors++;
          log.warn({ err: (err as Error).message, alertId: id }, 'relayed alert not read; boards see it when they next load the alerts');
          continue;
        }
        counters.alertsLoaded++;
        show(a);
      }
    });
  }

  function receive(msg: RelayMessage) {
    if (msg.from === self) return;
    if (msg.kind === 'ask') return answerAsk();
    if (msg.kind === 'alerts') return receiveAlerts(msg.alerts, msg.refs);
    const received = now();
    const base = Math.min(received, Math.max(msg.at, received - MAX_TRANSIT_MS));
    const changed: string[] = [];
    for (const u of msg.units) {
      const local = book.peek(u.unitId)?.version ?? -1;
      const held = relayed.get(u.unitId)?.version ?? -1;
      if (u.version <= local || u.version <= held) {
        counters.unitsOlder++;
        continue;
      }
      relayed.set(u.unitId, { ...u, base });
      changed.push(u.unitId);
    }
    counters.unitsAccepted += changed.length;
    if (msg.kind === 'snapshot') counters.unitsFromSnapshots += changed.length;
    if (changed.length) feed.emit('units', changed);
    // After a gap the episodes of the units that were behind may have changed too.
    const episodes = msg.kind === 'snapshot' ? changed : msg.episodes;
    if (episodes.length) feed.emit('episodes', episodes);
  }

  function onNotification(n: pg.Notification) {
    if (n.channel !== RELAY_CHANNEL || !n.payload) return;
    counters.notificationsReceived++;
    let msg: RelayMessage;
    try {
      msg = decodeRelay(n.payload);
    } catch (err) {
      counters.invalid++;
      log.warn({ err: (err as Error).message }, 'relay notification ignored');
      return;
    }
    receive(msg);
  }

  /** Opens the listening connection; after a gap it asks the other workers for what it missed. */
  async function open(afterGap: boolean): Promise<boolean> {
    const c = new pg.Client({ connectionString: deps.databaseUrl, application_name: `afterwatch-relay-${deps.workerId}`, keepAlive: true });
    let lost = false;
    const onLost = () => {
      if (lost) return;
      lost = true;
      if (client === c) {
        client = null;
        log.warn('relay connection lost; reconnecting');
      }
      c.end().catch(() => {});
      retryLater();
    };
    c.on('error', (err) => {
      log.warn({ err: err.message }, 'relay connection error');
      onLost();
    });
    c.on('end', onLost);
    c.on('notification', onNotification);
    try {
      await c.connect();
      await c.query(`LISTEN ${RELAY_CHANNEL}`);
    } catch (err) {
      log.warn({ err: (err as Error).message }, 'relay could not listen');
      onLost();
      return false;
    }
    if (lost || closed) {
      c.end().catch(() => {});
      return false;
    }
    client = c;
    attempt = 0;
    counters.connects++;
    if (afterGap) {
      ask = true;
      resyncSoon();
    }
    schedule();
    return true;
  }

  /** Units come back in the others' answers; alerts they do not hold, but their rows are in the database. */
  function resyncSoon() {
    if (resyncTimer) clearTimeout(resyncTimer);
    resyncTimer = setTimeout(() => {
      resyncTimer = null;
      if (!client || closed) return; // lost again: the next connection tells them
      counters.resyncs++;
      feed.emit('resync');
    }, RESYNC_AFTER_MS);
    resyncTimer.unref();
  }

  function retryLater() {
    if (retryTimer || closed) return;
    const delay = Math.min((deps.retryMs ?? 500) * 2 ** attempt, 5000);
    attempt++;
    retryTimer = setTimeout(() => {
      retryTimer = null;
      void open(true);
    }, delay);
  }

  // Listening starts before the ingest loads its memory from the database, so nothing judged in between is missed.
  await open(false);

  const presentHeld = (h: Held): LiveUnitView => {
    if (h.view.state !== 'purging' || h.remainingMs === null) return h.view;
    return { ...h.view, purgeRemainingS: Math.max(0, Math.ceil((h.remainingMs - (now() - h.base)) / 1000)) };
  };
  /** The relayed judgement if it is newer than this worker's memory of the unit. */
  const newer = (unitId: string): Held | null => {
    const h = relayed.get(unitId);
    if (!h) return null;
    const local = book.peek(unitId);
    if (!local || local.version < h.version) return h;
    relayed.delete(unitId);
    return null;
  };

  return {
    /** This worker's live feed listens here for the units other workers changed. */
    peers: feed as PeerEvents,
    counters,
    connected: () => client !== null,
    /** An alert this worker's live feed pushed: to the other workers' feeds. */
    relayAlert(alert: AlertView) {
      if (closed) return;
      stages.advance(alert);
      outAlerts.push(alert);
      schedule();
    },
    view(unitId: string): LiveUnitView {
      const h = newer(unitId);
      return h ? presentHeld(h) : book.view(unitId);
    },
    depotOf(unitId: string): string {
      return newer(unitId)?.depot ?? book.peek(unitId)?.profile.depot ?? '';
    },
    async close() {
      closed = true;
      if (retryTimer) clearTimeout(retryTimer);
      if (resyncTimer) clearTimeout(resyncTimer);
      const c = client;
      client = null;
      await c?.end().catch(() => {});
    },
  };
}

export type PeerRelay = Awaited<ReturnType<typeof startPeerRelay>>;
