// Gateways sign in with client id = username = gateway id, password = the gateway's secret (protocol: Transport).
import type { Client } from 'aedes';
import { GATEWAY_ID_PATTERN } from '../../shared/protocol/limits';
import type { BrokerCounters, CheckCredential } from '../types';
import { createHash } from 'node:crypto';

const BAD_CREDENTIALS = 4; // MQTT 3.1.1 CONNACK return code: bad user name or password
const NOT_AUTHORIZED = 5;
const CACHE_MS = 60_000;

interface CacheEntry {
  ok: boolean;
  until: number;
}

/** Caches each verdict for a minute, keyed by id and a digest of the password, so reconnect storms do not reach the database. */
export function createAuthenticate(check: CheckCredential, counters: BrokerCounters, onRefuse: (id: string, reason: string) => void) {
  const cache = new Map<string, CacheEntry>();
  const key = (id: string, password: Buffer) => `${id}\0${createHash('sha256').update(password).digest('base64')}`;

  const authenticate = (client: Client, username: string | undefined, password: Buffer | undefined, done: (err: (Error & { returnCode: number }) | null, ok: boolean | null) => void) => {
    const refuse = (code: number, reason: string) => {
      counters.authRefused++;
      onRefuse(client.id, reason);
      const err = Object.assign(new Error(reason), { returnCode: code });
      done(err, false);
    };
    if (!username || username !== client.id) return refuse(NOT_AUTHORIZED, 'client id must equal user name');
    if (!password) return refuse(BAD_CREDENTIALS, 'no password');
    const k = key(username, password);
    const hit = cache.get(k);
    const now = Date.now();
    const settle = (ok: boolean) => (ok ? done(null, true) : refuse(BAD_CREDENTIALS, 'wrong id or secret'));
    if (hit && hit.until > now) return settle(hit.ok);
    check(username, password.toString('utf8')).then(
      (result) => {
        if (result.service || GATEWAY_ID_PATTERN.test(username)) {
          cache.set(k, { ok: result.ok, until: now + CACHE_MS });
          if (cache.size > 100_000) cache.delete(cache.keys().next().value as string);
        }
        if (result.ok && result.service) (client as Client & { isService?: boolean }).isService = true;
        settle(result.ok);
      },
      () => refuse(3, 'credential check unavailable'),
    );
  };
  const forget = (id: string) => {
    for (const k of cache.keys()) if (k.startsWith(`${id}\0`)) cache.delete(k);
  };
  return { authenticate, forget };
}
