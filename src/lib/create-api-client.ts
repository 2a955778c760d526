import { ApiError, networkError, toApiError } from './api-error';
import type { SessionStore } from './session-store';

export interface ApiClientOptions {
  /** Prefix of every path, e.g. '' in the browser (same origin) or 'http://127.0.0.1:3000' in a test. */
  baseUrl: string;
  session: SessionStore;
  fetch?: typeof fetch;
}

export interface RequestOptions {
  method?: 'GET' | 'POST' | 'PATCH' | 'PUT' | 'DELETE';
  body?: unknown;
  query?: Record<string, string | number | undefined | null>;
  signal?: AbortSignal;
}

export interface ApiClient {
  request<T = unknown>(path: string, options?: RequestOptions): Promise<T>;
  get<T = unknown>(path: string, options?: Omit<RequestOptions, 'method' | 'body'>): Promise<T>;
  post<T = unknown>(path: string, body?: unknown): Promise<T>;
  patch<T = unknown>(path: string, body?: unknown): Promise<T>;
  delete<T = unknown>(path: string): Promise<T>;
}

function withQuery(path: string, query: RequestOptions['query']): string {
  if (!query) return path;
  const params = new URLSearchParams();
  for (const [k, v] of Object.entries(query)) if (v !== undefined && v !== null && v !== '') params.set(k, String(v));
  const qs = params.toString();
  return qs ? `${path}?${qs}` : path;
}

/**
 * JSON over HTTP with the session's bearer token. A 401 ends the session (the guard then sends
 * the person to /sign-in); every failure becomes an ApiError.
 */
export function createApiClient({ baseUrl, session, fetch: doFetch = globalThis.fetch.bind(globalThis) }: ApiClientOptions): ApiClient {
  async function request<T>(path: string, { method = 'GET', body, query, signal }: RequestOptions = {}): Promise<T> {
    const headers: Record<string, string> = { Accept: 'application/json' };
    const current = session.get();
    if (current) headers.Authorization = `Bearer ${current.token}`;
    if (body !== undefined) headers['Content-Type'] = 'application/json';

    let res: Response;
    try {
      res = await doFetch(baseUrl + withQuery(path, query), {
        method,
        headers,
        body: body === undefined ? undefined : JSON.stringify(body),
        signal,
      });
    } catch (cause) {
      if (signal?.aborted) throw cause;
      throw networkError(cause);
    }

    const text = await res.text();
    let parsed: unknown = undefined;
    if (text) {
      try {
        parsed = JSON.parse(text);
      } catch {
        if (res.ok) throw new ApiError(res.status, 'bad_response', 'The server answered with something that is not JSON.');
      }
    }
    if (!res.ok) {
      const error = toApiError(res.status, res.statusText, parsed);
      // A rejected token ends the session; a failed sign-in (no token sent) does not.
      if (res.status === 401 && current) session.clear('rejected');
      throw error;
    }
    return parsed as T;
  }

  return {
    request,
    get: (path, options) => request(path, { ...options, method: 'GET' }),
    post: (path, body) => request(path, { method: 'POST', body }),
    patch: (path, body) => request(path, { method: 'PATCH', body }),
    delete: (path) => request(path, { method: 'DELETE' }),
  };
}
