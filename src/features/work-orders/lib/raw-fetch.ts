import { toApiError } from '../../../lib/api-error';
import { session } from '../../../lib/session';

/** A signed-in request whose body or answer is not JSON (a photo upload, an image to show). */
export async function rawFetch(path: string, init: RequestInit = {}): Promise<Response> {
  const current = session.get();
  const headers = new Headers(init.headers);
  if (current) headers.set('Authorization', `Bearer ${current.token}`);
  const res = await fetch(path, { ...init, headers });
  if (!res.ok) {
    const text = await res.text();
    let body: unknown;
    try {
      body = JSON.parse(text);
    } catch {
      body = undefined;
    }
    if (res.status === 401 && current) session.clear('rejected');
    throw toApiError(res.status, res.statusText, body);
  }
  return res;
}
