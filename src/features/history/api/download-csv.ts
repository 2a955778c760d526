// A file download behind the bearer token: fetched with the session's token, handed to the browser as a blob.
import { toApiError } from '../../../lib/api-error';
import { session } from '../../../lib/session';

function filenameOf(res: Response, fallback: string) {
  const m = /filename="([^"]+)"/.exec(res.headers.get('Content-Disposition') ?? '');
  return m ? m[1] : fallback;
}

export async function downloadFile(path: string, query: Record<string, string | number>, fallbackName: string) {
  const qs = new URLSearchParams(Object.entries(query).map(([k, v]) => [k, String(v)])).toString();
  const token = session.get()?.token;
  const res = await fetch(qs ? `${path}?${qs}` : path, { headers: token ? { Authorization: `Bearer ${token}` } : {} });
  if (!res.ok) {
    const body = await res.json().catch(() => undefined);
    throw toApiError(res.status, res.statusText, body);
  }
  const url = URL.createObjectURL(await res.blob());
  const a = document.createElement('a');
  a.href = url;
  a.download = filenameOf(res, fallbackName);
  document.body.append(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 60_000);
}
