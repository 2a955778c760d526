import jwt from 'jsonwebtoken';
import { describe, expect, it } from 'vitest';
import { createSessionStore, tokenExpiry } from '../../src/lib/session-store';
import { MemoryStorage } from './memory-storage';

const user = { id: 1, email: 'ops@depot.example', name: 'Night desk', role: 'monitor' as const };

describe('reading a token\'s expiry', () => {
  // Reference: tokens signed by the jsonwebtoken library (npm), whose `exp` follows RFC 7519 4.1.4.
  it('reads the exp claim of a token signed by jsonwebtoken, in milliseconds', () => {
    const token = jwt.sign({ sub: '1' }, 'test-secret', { expiresIn: '12h' });
    const decoded = jwt.decode(token) as { exp: number };
    expect(tokenExpiry(token)).toBe(decoded.exp * 1000);
  });

  it('reads a claim whose base64url needs characters outside plain base64', () => {
    const token = jwt.sign({ sub: '1', note: '??>>~~' }, 'test-secret', { expiresIn: 60 });
    expect(tokenExpiry(token)).toBe((jwt.decode(token) as { exp: number }).exp * 1000);
  });

  it('gives null for a token with no exp and for something that is not a JWT', () => {
    expect(tokenExpiry(jwt.sign({ sub: '1' }, 'test-secret'))).toBeNull();
    expect(tokenExpiry('not-a-token')).toBeNull();
    expect(tokenExpiry('a.b%%.c')).toBeNull();
  });
});

describe('the session store', () => {
  it('keeps a signed-in session across a reload (a new store on the same storage)', () => {
    const storage = new MemoryStorage();
    const token = jwt.sign({ sub: '1' }, 'k', { expiresIn: '1h' });
    createSessionStore(storage).set(token, user);
    const again = createSessionStore(storage).get();
    expect(again?.token).toBe(token);
    expect(again?.user.email).toBe(user.email);
  });

  it('forgets the session once the token has expired, and says why', () => {
    const storage = new MemoryStorage();
    let now = Date.now();
    const store = createSessionStore(storage, () => now);
    const token = jwt.sign({ sub: '1' }, 'k', { expiresIn: 60 });
    store.set(token, user);
    expect(store.get()).not.toBeNull();
    now += 61_000;
    expect(store.get()).toBeNull();
    expect(store.lastEndReason()).toBe('expired');
    expect(storage.length).toBe(0);
  });

  it('ignores stored data that is not a session', () => {
    const storage = new MemoryStorage();
    storage.setItem('afterwatch.session', '{"token": 5}');
    expect(createSessionStore(storage).get()).toBeNull();
    storage.setItem('afterwatch.session', 'not json');
    expect(createSessionStore(storage).get()).toBeNull();
  });

  it('tells subscribers when a session starts and ends', () => {
    const store = createSessionStore(new MemoryStorage());
    const seen: (string | null)[] = [];
    store.subscribe(() => seen.push(store.get()?.user.email ?? null));
    store.set(jwt.sign({ sub: '1' }, 'k', { expiresIn: 60 }), user);
    store.clear('signedOut');
    expect(seen).toEqual([user.email, null]);
    expect(store.lastEndReason()).toBe('signedOut');
  });
});
