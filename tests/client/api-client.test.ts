import { createServer, type IncomingMessage, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import jwt from 'jsonwebtoken';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ApiError } from '../../src/lib/api-error';
import { createApiClient } from '../../src/lib/create-api-client';
import { createSessionStore } from '../../src/lib/session-store';
import { MemoryStorage } from './memory-storage';

// A real HTTP server on loopback answering in the API's error shape {error: {code, message, details}}.
let server: Server;
let baseUrl: string;
let lastRequest: { headers: IncomingMessage['headers']; body: string; url: string } | null = null;

beforeAll(async () => {
  server = createServer((req, res) => {
    let body = '';
    req.on('data', (c) => (body += c));
    req.on('end', () => {
      lastRequest = { headers: req.headers, body, url: req.url ?? '' };
      const send = (status: number, payload?: unknown) => {
        res.writeHead(status, { 'Content-Type': 'application/json' });
        res.end(payload === undefined ? '' : JSON.stringify(payload));
      };
      if (req.url?.startsWith('/api/units')) return send(200, [{ id: 'T-1' }]);
      if (req.url === '/api/expired') return send(401, { error: { code: 'unauthenticated', message: 'Token expired' } });
      if (req.url === '/api/bad')
        return send(400, { error: { code: 'validation_error', message: 'Invalid body', details: [{ path: ['purgeSeconds'], message: 'Too small' }] } });
      if (req.url === '/api/plain') {
        res.writeHead(502, 'Bad Gateway', { 'Content-Type': 'text/html' });
        return res.end('<html>proxy error</html>');
      }
      if (req.method === 'DELETE') return send(204);
      send(404, { error: { code: 'not_found', message: 'No such thing' } });
    });
  });
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  baseUrl = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
});
afterAll(() => new Promise<void>((resolve) => server.close(() => resolve())));

function signedIn() {
  const session = createSessionStore(new MemoryStorage());
  session.set(jwt.sign({ sub: '7' }, 'k', { expiresIn: '1h' }), { id: 7, email: 'a@b.example', name: 'A', role: 'admin' });
  return session;
}

describe('the API client', () => {
  it('sends the bearer token and the query, and returns the parsed body', async () => {
    const session = signedIn();
    const api = createApiClient({ baseUrl, session });
    const data = await api.get('/api/units', { query: { depot: 'North yard', state: undefined } });
    expect(data).toEqual([{ id: 'T-1' }]);
    expect(lastRequest?.headers.authorization).toBe(`Bearer ${session.get()!.token}`);
    expect(lastRequest?.url).toBe('/api/units?depot=North+yard');
  });

  it('sends a JSON body', async () => {
    const api = createApiClient({ baseUrl, session: signedIn() });
    await expect(api.post('/api/nowhere', { a: 1 })).rejects.toBeInstanceOf(ApiError);
    expect(lastRequest?.headers['content-type']).toBe('application/json');
    expect(JSON.parse(lastRequest!.body)).toEqual({ a: 1 });
  });

  it('turns the error shape into an ApiError with status, code, message and field details', async () => {
    const api = createApiClient({ baseUrl, session: signedIn() });
    const err = await api.post('/api/bad', {}).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(ApiError);
    const e = err as ApiError;
    expect([e.status, e.code, e.message]).toEqual([400, 'validation_error', 'Invalid body']);
    expect(e.fieldErrors()).toEqual({ purgeSeconds: 'Too small' });
  });

  it('ends the session when the server rejects the token', async () => {
    const session = signedIn();
    const api = createApiClient({ baseUrl, session });
    await expect(api.get('/api/expired')).rejects.toMatchObject({ status: 401, code: 'unauthenticated' });
    expect(session.get()).toBeNull();
    expect(session.lastEndReason()).toBe('rejected');
  });

  it('sends no Authorization header when nobody is signed in', async () => {
    const api = createApiClient({ baseUrl, session: createSessionStore(new MemoryStorage()) });
    await expect(api.get('/api/expired')).rejects.toMatchObject({ status: 401 });
    expect(lastRequest?.headers.authorization).toBeUndefined();
  });

  it('reports a non-JSON error page by its HTTP status', async () => {
    const api = createApiClient({ baseUrl, session: signedIn() });
    await expect(api.get('/api/plain')).rejects.toMatchObject({ status: 502, code: 'http_502', message: 'Bad Gateway' });
  });

  it('accepts an empty 204 answer', async () => {
    const api = createApiClient({ baseUrl, session: signedIn() });
    await expect(api.delete('/api/gateways/gw-1')).resolves.toBeUndefined();
  });

  it('reports an unreachable server as a network error', async () => {
    const closed = createServer();
    await new Promise<void>((r) => closed.listen(0, '127.0.0.1', r));
    const port = (closed.address() as AddressInfo).port;
    await new Promise<void>((r) => closed.close(() => r()));
    const api = createApiClient({ baseUrl: `http://127.0.0.1:${port}`, session: signedIn() });
    await expect(api.get('/api/units')).rejects.toMatchObject({ status: 0, code: 'network_error' });
  });
});
