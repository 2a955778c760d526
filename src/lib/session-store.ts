import { z } from 'zod';

export const RoleSchema = z.enum(['admin', 'monitor', 'planner', 'technician']);
export type Role = z.infer<typeof RoleSchema>;

export const SessionUserSchema = z.object({
  id: z.union([z.string(), z.number()]),
  email: z.string(),
  name: z.string(),
  role: RoleSchema,
});
export type SessionUser = z.infer<typeof SessionUserSchema>;

const StoredSessionSchema = z.object({
  token: z.string().min(1),
  user: SessionUserSchema,
  /** Epoch ms when the token stops being accepted, from its `exp` claim; null if it has none. */
  expiresAt: z.number().nullable(),
});
export type Session = z.infer<typeof StoredSessionSchema>;

/** Why the last session ended, so the sign-in page can say so. */
export type EndReason = 'signedOut' | 'expired' | 'rejected';

const STORAGE_KEY = 'afterwatch.session';

/**
 * The `exp` claim of a JWT (RFC 7519 section 4.1.4: seconds since the epoch) as epoch ms, or null
 * when the token is not a JWT or carries no numeric `exp`. Only read to know when to stop using
 * the token; the server alone decides whether it is valid.
 */
export function tokenExpiry(token: string): number | null {
  const parts = token.split('.');
  if (parts.length !== 3) return null;
  try {
    const base64 = parts[1].replace(/-/g, '+').replace(/_/g, '/');
    const padded = base64 + '='.repeat((4 - (base64.length % 4)) % 4);
    const claims: unknown = JSON.parse(atob(padded));
    if (claims && typeof claims === 'object' && 'exp' in claims && typeof claims.exp === 'number') {
      return claims.exp * 1000;
    }
    return null;
  } catch {
    return null;
  }
}

export interface SessionStore {
  get(): Session | null;
  set(token: string, user: SessionUser): Session;
  clear(reason: EndReason): void;
  lastEndReason(): EndReason | null;
  subscribe(listener: () => void): () => void;
}

/** A session kept in `storage`, forgotten as soon as its token has expired by `now()`. */
export function createSessionStore(storage: Storage, now: () => number = Date.now): SessionStore {
  const listeners = new Set<() => void>();
  let cached: Session | null | undefined;
  let endReason: EndReason | null = null;
  const notify = () => listeners.forEach((l) => l());

  function read(): Session | null {
    const raw = storage.getItem(STORAGE_KEY);
    if (!raw) return null;
    try {
      const parsed = StoredSessionSchema.safeParse(JSON.parse(raw));
      return parsed.success ? parsed.data : null;
    } catch {
      return null;
    }
  }

  const store: SessionStore = {
    get() {
      if (cached === undefined) cached = read();
      if (cached && cached.expiresAt !== null && cached.expiresAt <= now()) {
        // Silent here: get() runs during render. The timer in the provider announces expiry.
        storage.removeItem(STORAGE_KEY);
        cached = null;
        endReason = 'expired';
      }
      return cached;
    },
    set(token, user) {
      const session: Session = { token, user, expiresAt: tokenExpiry(token) };
      storage.setItem(STORAGE_KEY, JSON.stringify(session));
      cached = session;
      endReason = null;
      notify();
      return session;
    },
    clear(reason) {
      const had = cached !== null;
      storage.removeItem(STORAGE_KEY);
      cached = null;
      endReason = reason;
      if (had) notify();
    },
    lastEndReason: () => endReason,
    subscribe(listener) {
      listeners.add(listener);
      return () => listeners.delete(listener);
    },
  };
  return store;
}

