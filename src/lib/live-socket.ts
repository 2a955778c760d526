import { ServerMessageSchema, type ServerMessage } from '../../shared/realtime/envelope';

export type LiveStatus = 'connecting' | 'live' | 'reconnecting' | 'closed';

export interface LiveSocketOptions {
  /** Path and query on this origin, e.g. `/api/live?token=…`. */
  path: string;
  onMessage: (msg: ServerMessage) => void;
  onStatus?: (status: LiveStatus) => void;
  /** Called with the close code; return false to stop reconnecting (e.g. 4003, a withdrawn link). */
  onClose?: (code: number, everOpened: boolean) => boolean | void;
}

/** ws:// or wss:// matching the page, same origin (the dev server forwards /api with ws: true). */
export function liveUrl(path: string, loc: Pick<Location, 'protocol' | 'host'> = window.location): string {
  return `${loc.protocol === 'https:' ? 'wss:' : 'ws:'}//${loc.host}${path}`;
}

/**
 * Back-off before reconnect attempt `n` (0-based): doubling from 1 s, capped at 30 s, with "full
 * jitter" (a random delay between half and the whole step), so a depot's screens do not all
 * reconnect in the same instant after a restart. Common practice, no published source.
 */
export function reconnectDelayMs(attempt: number, random: () => number = Math.random): number {
  const step = Math.min(30_000, 1000 * 2 ** Math.min(attempt, 5));
  return Math.round(step / 2 + random() * (step / 2));
}

/** One WebSocket that reconnects with back-off; every message is checked against the shared envelope. */
export function openLiveSocket({ path, onMessage, onStatus, onClose }: LiveSocketOptions): { close(): void } {
  let ws: WebSocket | null = null;
  let attempt = 0;
  let timer: ReturnType<typeof setTimeout> | null = null;
  let stopped = false;

  const connect = () => {
    timer = null;
    if (stopped) return;
    onStatus?.(attempt === 0 ? 'connecting' : 'reconnecting');
    let opened = false;
    const socket = new WebSocket(liveUrl(path));
    ws = socket;
    socket.onopen = () => {
      opened = true;
      attempt = 0;
      onStatus?.('live');
    };
    socket.onmessage = (ev) => {
      let data: unknown;
      try {
        data = JSON.parse(String(ev.data));
      } catch {
        return; // not JSON: ignored, the envelope is the contract
      }
      const parsed = ServerMessageSchema.safeParse(data);
      if (parsed.success) onMessage(parsed.data);
    };
    socket.onclose = (ev) => {
      if (ws === socket) ws = null;
      if (stopped) return;
      if (onClose?.(ev.code, opened) === false) {
        stopped = true;
        onStatus?.('closed');
        return;
      }
      onStatus?.('reconnecting');
      timer = setTimeout(connect, reconnectDelayMs(attempt++));
    };
  };

  connect();
  return {
    close() {
      stopped = true;
      if (timer) clearTimeout(timer);
      ws?.close(1000, 'page closed');
      ws = null;
    },
  };
}
