/** An error answered by the server, in its `{error: {code, message, details}}` shape. */
export class ApiError extends Error {
  readonly status: number;
  readonly code: string;
  readonly details: unknown;

  constructor(status: number, code: string, message: string, details?: unknown) {
    super(message);
    this.name = 'ApiError';
    this.status = status;
    this.code = code;
    this.details = details;
  }

  /** Field messages of a 400 `validation_error` (zod issues `[{path, message}]`), keyed by dotted path. */
  fieldErrors(): Record<string, string> {
    const out: Record<string, string> = {};
    if (!Array.isArray(this.details)) return out;
    for (const issue of this.details) {
      if (!issue || typeof issue !== 'object') continue;
      const { path, message } = issue as { path?: unknown; message?: unknown };
      const key = Array.isArray(path) ? path.join('.') : typeof path === 'string' ? path : '';
      if (key && typeof message === 'string' && !(key in out)) out[key] = message;
    }
    return out;
  }
}

/** Builds the ApiError for a failed response body, whether or not the body has the agreed shape. */
export function toApiError(status: number, statusText: string, body: unknown): ApiError {
  if (body && typeof body === 'object' && 'error' in body) {
    const e = (body as { error: unknown }).error;
    if (e && typeof e === 'object') {
      const { code, message, details } = e as { code?: unknown; message?: unknown; details?: unknown };
      return new ApiError(
        status,
        typeof code === 'string' ? code : `http_${status}`,
        typeof message === 'string' ? message : statusText || `Request failed (${status})`,
        details,
      );
    }
  }
  return new ApiError(status, `http_${status}`, statusText || `Request failed (${status})`);
}

/** A network failure (server down, connection refused) as an ApiError with status 0. */
export function networkError(cause: unknown): ApiError {
  const err = new ApiError(0, 'network_error', 'Cannot reach the Afterwatch server. Check that it is running.');
  (err as { cause?: unknown }).cause = cause;
  return err;
}
