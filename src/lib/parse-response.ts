import type { z } from 'zod';
import { ApiError } from './api-error';

/** Checks a response against the shape the client relies on, so a contract drift shows as a clear error. */
export function parseResponse<S extends z.ZodType>(schema: S, data: unknown, what: string): z.infer<S> {
  const result = schema.safeParse(data);
  if (result.success) return result.data;
  const first = result.error.issues[0];
  const where = first ? `${first.path.join('.') || '(root)'}: ${first.message}` : 'unknown';
  throw new ApiError(0, 'bad_response', `The server's ${what} did not have the expected shape (${where}).`, result.error.issues);
}
