// A real ws client of the live feed that records every envelope it receives (validated with the shared schema).
import WebSocket from 'ws';
import { ServerMessageSchema, type ServerMessage } from '../../shared/realtime/envelope';

export interface LiveClient {
  messages: ServerMessage[];
  waitFor<T extends ServerMessage>(pred: (m: ServerMessage) => m is T, timeoutMs?: number): Promise<T>;
  waitFor(pred: (m: ServerMessage) => boolean, timeoutMs?: number): Promise<ServerMessage>;
  close(): void;
  ws: WebSocket;
}

export function openLive(url: string): Promise<LiveClient> {
  return new Promise((resolve, reject) => {
    const ws = new WebSocket(url);
    const messages: ServerMessage[] = [];
    const waiters: { pred: (m: ServerMessage) => boolean; res: (m: ServerMessage) => void }[] = [];
    ws.on('message', (data) => {
      const m = ServerMessageSchema.parse(JSON.parse(data.toString()));
      messages.push(m);
      for (const w of waiters.slice()) if (w.pred(m)) {
        waiters.splice(waiters.indexOf(w), 1);
        w.res(m);
      }
    });
    ws.once('open', () =>
      resolve({
        ws,
        messages,
        waitFor: (pred: (m: ServerMessage) => boolean, timeoutMs = 5000) =>
          new Promise<ServerMessage>((res, rej) => {
            const found = messages.find(pred);
            if (found) return res(found);
            const timer = setTimeout(() => rej(new Error('no such live message in time')), timeoutMs);
            waiters.push({ pred, res: (m) => (clearTimeout(timer), res(m)) });
          }),
        close: () => ws.close(),
      } as LiveClient),
    );
    ws.once('unexpected-response', (_req, res) => reject(new Error(`refused with ${res.statusCode}`)));
    ws.once('error', reject);
  });
}
