// The live feed: a WebSocket endpoint on the web server. Signed-in users get the whole fleet; a switch
// page gets its one unit's indicator. A unit that changed state (key-off, purge ended, supply lost) is
// pushed at once, after the commit that judged it, though never sooner than `minGapMs` after the last
// push (a fast replay commits hundreds of batches a second, and each push re-renders every board); the
// other changes (new readings) are coalesced for a few tens of ms and go with the next push.
import type { IncomingMessage, Server } from 'node:http';
import type { Duplex } from 'node:stream';
import { WebSocketServer, type WebSocket } from 'ws';
import type { Logger } from 'pino';
import { ClientMessageSchema, LIVE_PATH, type IndicatorView, type ServerMessage, type UnitDelta } from '../../shared/realtime/envelope';
import { indicatorFor } from '../../shared/protocol/indicator';
import type { UnitStateName } from '../../shared/api/units';
import type { LiveUnitView } from '../lib/context';
import type { FleetEvents } from '../ingest/fleet-events';
import type { PeerEvents } from './peer-relay';

export interface LiveFeedDeps {
  http: Server;
  events: FleetEvents;
  /** Behind an external broker: the units other workers judged and the alerts they pushed (peer-relay.ts), pushed like this worker's own. */
  peers?: PeerEvents;
  log: Logger;
  /** Resolves a user's token; throws if it is not valid. */
  verifyUser(token: string): Promise<unknown>;
  /** Resolves a switch page's token to its unit, or null. */
  switchUnit(token: string): Promise<string | null>;
  view(unitId: string): LiveUnitView;
  depotOf(unitId: string): string;
  coalesceMs?: number;
  /** Pushes are at least this far apart (default 20 ms). */
  minGapMs?: number;
  heartbeatMs?: number;
}

interface Peer {
  ws: WebSocket;
  scope: 'fleet' | 'switch';
  unitId: string | null;
  alive: boolean;
}

export function toDelta(unitId: string, depot: string, v: LiveUnitView): UnitDelta {
  return { id: unitId, depot, state: v.state as UnitDelta['state'], stateSince: v.stateSince, purgeRemainingS: v.purgeRemainingS, lastSupplyV: v.lastSupplyV, lastAmbientC: v.lastAmbientC, lastSeenAt: v.lastSeenAt };
}

export function indicatorView(v: LiveUnitView): IndicatorView {
  const state = indicatorFor(v.state as UnitStateName | null) ?? 'unknown';
  return { state, remainingS: v.state === 'purging' ? v.purgeRemainingS : null, rerunNeeded: v.state === 'interrupted', since: v.stateSince };
}

export function startLiveFeed(deps: LiveFeedDeps) {
  const wss = new WebSocketServer({ noServer: true, maxPayload: 4096 });
  const peers = new Set<Peer>();
  let pending = new Set<string>();
  let timer: NodeJS.Timeout | null = null;
  let timerDue = Infinity;
  let soon: NodeJS.Immediate | null = null;
  let lastPush = -Infinity;

  /** `msg` as text already (one text for every board a push goes to), or to be made for this one reader. */
  const send = (p: Peer, msg: ServerMessage | string) => {
    if (p.ws.readyState !== p.ws.OPEN) return;
    if (p.ws.bufferedAmount > 4 * 1024 * 1024) return p.ws.terminate(); // a reader this far behind is gone
    p.ws.send(typeof msg === 'string' ? msg : JSON.stringify(msg));
  };

  const flush = () => {
    if (timer) clearTimeout(timer);
    if (soon) clearImmediate(soon);
    timer = null;
    timerDue = Infinity;
    soon = null;
    lastPush = Date.now();
    const changed = pending;
    pending = new Set();
    const sentAt = new Date().toISOString();
    let fleetText: string | null = null;
    for (const p of peers) {
      if (p.scope === 'fleet') send(p, (fleetText ??= fleetUnits(changed, sentAt)));
      else if (p.unitId && changed.has(p.unitId)) send(p, { type: 'switch', sentAt, unitId: p.unitId, indicator: indicatorView(deps.view(p.unitId)) });
    }
  };

  /** The push to the boards, as text: made once, whatever the number of boards (and not at all for none). */
  const fleetUnits = (ids: Set<string>, sentAt: string) => {
    const units = [...ids].map((id) => toDelta(id, deps.depotOf(id), deps.view(id)));
    return JSON.stringify({ type: 'units', sentAt, units } satisfies ServerMessage);
  };

  /** `stateChanged`: one of them entered another state, which the boards show without waiting (the rest ride along). */
  const unitsChanged = (unitIds: string[], stateChanged = false) => {
    for (const id of unitIds) pending.add(id);
    const now = Date.now();
    pushBy(stateChanged ? lastPush + (deps.minGapMs ?? 20) : now + (deps.coalesceMs ?? 25), now);
  };
  /** Makes sure a push happens by `due` (an earlier one already planned stands). */
  const pushBy = (due: number, now: number) => {
    if (soon || timerDue <= due) return;
    if (timer) clearTimeout(timer);
    timer = null;
    timerDue = Infinity;
    // Due now: after the events of this turn (the commit's other listeners), not inside them.
    if (due <= now) soon = setImmediate(flush);
    else {
      timer = setTimeout(flush, due - now);
      timerDue = due;
    }
  };
  /** To every signed-in board (not the switch pages). */
  const broadcast = (msg: ServerMessage) => {
    let text: string | null = null;
    for (const p of peers) if (p.scope === 'fleet') send(p, (text ??= JSON.stringify(msg)));
  };
  const episodesChanged = (unitIds: string[]) => broadcast({ type: 'episodes', unitIds: [...new Set(unitIds)] });
  deps.events.on('units', (changes) => unitsChanged(changes.map((c) => c.unitId), changes.some((c) => c.state?.state !== c.previous?.state)));
  deps.events.on('episodes', (changes) => episodesChanged(changes.map((c) => c.unitId)));
  // Relayed from other workers: coalesced like readings (the relay does not say which changed state).
  deps.peers?.on('units', (unitIds) => unitsChanged(unitIds));
  deps.peers?.on('episodes', episodesChanged);
  deps.peers?.on('alert', (alert) => broadcast({ type: 'alert', alert }));
  // The relay missed notifications: a fresh hello makes each board re-read, as after its own reconnect.
  deps.peers?.on('resync', () => {
    for (const p of peers) if (p.scope === 'fleet') sendHello(p);
  });

  const refuse = (socket: Duplex, status: number, text: string) => {
    socket.write(`HTTP/1.1 ${status} ${text}\r\nConnection: close\r\nContent-Type: text/plain\r\n\r\n${text}\n`);
    socket.destroy();
  };

  const onUpgrade = async (req: IncomingMessage, socket: Duplex, head: Buffer) => {
    const url = new URL(req.url ?? '/', 'http://localhost');
    if (url.pathname !== LIVE_PATH) return; // not ours (e.g. Vite's dev socket)
    let scope: Peer['scope'];
    let unitId: string | null = null;
    try {
      const switchToken = url.searchParams.get('switch');
      if (switchToken) {
        unitId = await deps.switchUnit(switchToken);
        if (!unitId) return refuse(socket, 403, 'Forbidden');
        scope = 'switch';
      } else {
        await deps.verifyUser(url.searchParams.get('token') ?? '');
        scope = 'fleet';
      }
    } catch {
      return refuse(socket, 401, 'Unauthorized');
    }
    wss.handleUpgrade(req, socket, head, (ws) => {
      const peer: Peer = { ws, scope, unitId, alive: true };
      peers.add(peer);
      ws.on('pong', () => (peer.alive = true));
      ws.on('close', () => peers.delete(peer));
      ws.on('error', () => ws.terminate());
      ws.on('message', (data) => {
        const parsed = ClientMessageSchema.safeParse(safeJson(data.toString()));
        if (!parsed.success) return ws.close(1003, 'unknown message');
        if (parsed.data.type === 'resync') sendHello(peer);
      });
      sendHello(peer);
    });
  };

  const sendHello = (p: Peer) => {
    send(p, { type: 'hello', serverTime: new Date().toISOString(), scope: p.scope });
    if (p.scope === 'switch' && p.unitId) send(p, { type: 'switch', sentAt: new Date().toISOString(), unitId: p.unitId, indicator: indicatorView(deps.view(p.unitId)) });
  };

  deps.http.on('upgrade', (req, socket, head) => {
    onUpgrade(req, socket, head).catch((err) => {
      deps.log.warn({ err }, 'live feed upgrade failed');
      socket.destroy();
    });
  });

  // Heartbeat: a socket that did not answer the last ping is dropped.
  const heartbeat = setInterval(() => {
    for (const p of peers) {
      if (!p.alive) {
        p.ws.terminate();
        peers.delete(p);
        continue;
      }
      p.alive = false;
      p.ws.ping();
    }
  }, deps.heartbeatMs ?? 15_000);
  heartbeat.unref();

  return {
    peers: () => peers.size,
    broadcast,
    /** Closes the switch pages of a unit whose token was revoked. */
    dropSwitch(unitId: string) {
      for (const p of peers) if (p.scope === 'switch' && p.unitId === unitId) p.ws.close(4003, 'revoked');
    },
    close() {
      clearInterval(heartbeat);
      if (timer) clearTimeout(timer);
      if (soon) clearImmediate(soon);
      for (const p of peers) p.ws.terminate();
      wss.close();
    },
  };
}

function safeJson(s: string): unknown {
  try {
    return JSON.parse(s);
  } catch {
    return null;
  }
}
