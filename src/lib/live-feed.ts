import { useQueryClient, type QueryClient } from '@tanstack/react-query';
import { useEffect } from 'react';
import type { AlertView, ServerMessage, UnitDelta } from '../../shared/realtime/envelope';
import { LIVE_PATH } from '../../shared/realtime/envelope';
import { upsertAlert } from './alert-cache';
import { api } from './api-client';
import { openLiveSocket, type LiveStatus } from './live-socket';
import { createStore } from './live-store';
import { queryKeys } from './query-keys';

/** The fleet feed's connection, for the indicator in the shell. */
export const liveStatus = createStore<LiveStatus>('closed');
/** Open alerts that arrived over the feed while this page was open, newest first: the board's banner. */
export const bannerAlerts = createStore<AlertView[]>([]);

export function dismissBannerAlert(id: number) {
  bannerAlerts.set(bannerAlerts.get().filter((a) => a.id !== id));
}

/** A unit as cached: the server's fields plus when the browser received them (for countdowns). */
interface CachedUnit {
  id: string;
  receivedAt?: number;
}

/**
 * Merges deltas into the cached list and unit details without refetching. A delta for a unit the
 * list does not know yet (just created elsewhere) makes the list refetch instead.
 */
export function mergeUnitDeltas(qc: QueryClient, deltas: UnitDelta[], receivedAt: number) {
  const byId = new Map(deltas.map((d) => [d.id, d]));
  let unknown = false;
  qc.setQueryData<CachedUnit[]>(queryKeys.units, (list) => {
    if (!list) return list;
    const seen = new Set<string>();
    const next = list.map((u) => {
      const d = byId.get(u.id);
      if (!d) return u;
      seen.add(u.id);
      return { ...u, ...d, receivedAt };
    });
    unknown = deltas.some((d) => !seen.has(d.id));
    return next;
  });
  for (const d of deltas) {
    qc.setQueryData<CachedUnit>(queryKeys.unit(d.id), (u) => (u ? { ...u, ...d, receivedAt } : u));
  }
  if (unknown) void qc.invalidateQueries({ queryKey: queryKeys.units, exact: true });
}

// Alerts that need someone at the unit now raise the banner; others only join the alerts page.
const BANNER_KINDS: ReadonlySet<AlertView['kind']> = new Set(['interruptedPurge', 'undeterminedCold', 'contactLost']);

function alertKnown(qc: QueryClient, id: number): boolean {
  return qc.getQueriesData<AlertView[]>({ queryKey: queryKeys.alerts }).some(([, list]) => list?.some((a) => a.id === id));
}

/** What each feed message does to the query cache and the banner; `seen` holds the alert ids this tab has had. */
export function applyFleetMessage(qc: QueryClient, msg: ServerMessage, seen: Set<number>, now = Date.now()) {
  switch (msg.type) {
    case 'hello':
      // (Re)connected: anything may have changed while the socket was down, so refetch all live data.
      for (const key of [queryKeys.units, queryKeys.episodes, queryKeys.faults, queryKeys.alerts]) void qc.invalidateQueries({ queryKey: key });
      return;
    case 'units':
      return mergeUnitDeltas(qc, msg.units, now);
    case 'episodes':
      for (const id of msg.unitIds) {
        void qc.invalidateQueries({ queryKey: queryKeys.unitEpisodes(id) });
        void qc.invalidateQueries({ queryKey: queryKeys.unitFaults(id) });
        void qc.invalidateQueries({ queryKey: queryKeys.unitTimeline(id) });
        void qc.invalidateQueries({ queryKey: queryKeys.unitReadings(id) });
      }
      return;
    case 'alert': {
      const a = msg.alert;
      const isNew = !seen.has(a.id) && !alertKnown(qc, a.id);
      seen.add(a.id);
      upsertAlert(qc, a);
      const banner = bannerAlerts.get();
      if (a.status === 'open' && isNew && BANNER_KINDS.has(a.kind)) bannerAlerts.set([a, ...banner]);
      else if (banner.some((b) => b.id === a.id)) {
        // Acknowledged or resolved elsewhere: it leaves the banner; still open: refresh its figures.
        bannerAlerts.set(a.status === 'open' ? banner.map((b) => (b.id === a.id ? a : b)) : banner.filter((b) => b.id !== a.id));
      }
      return;
    }
    case 'switch':
      return; // switch scope only
  }
}

/** Opens the fleet feed for a signed-in user while mounted (one socket per tab). */
export function useFleetFeed(token: string | null) {
  const qc = useQueryClient();
  useEffect(() => {
    if (!token) return;
    const seen = new Set<number>();
    const socket = openLiveSocket({
      path: `${LIVE_PATH}?token=${encodeURIComponent(token)}`,
      onMessage: (msg) => applyFleetMessage(qc, msg, seen),
      onStatus: (s) => liveStatus.set(s),
      onClose: (_code, everOpened) => {
        // A refused upgrade (expired or revoked token) shows only as a failed socket: asking
        // /api/auth/me lets the API client end the session on a 401.
        if (!everOpened) api.get('/api/auth/me').catch(() => undefined);
      },
    });
    return () => {
      socket.close();
      liveStatus.set('closed');
      bannerAlerts.set([]);
    };
  }, [qc, token]);
}
