import { createHash, pbkdf2Sync, randomBytes, timingSafeEqual } from 'node:crypto';

/** 256 random bits: a token this strong needs no slow hash, SHA-256 is enough. */
export const newGatewaySecret = () => randomBytes(32).toString('base64url');
export const hashGatewaySecret = (secret: string) => createHash('sha256').update(secret, 'utf8').digest('hex');

export function secretMatches(secret: string, hash: string): boolean {
  const a = Buffer.from(hashGatewaySecret(secret), 'hex');
  const b = Buffer.from(hash, 'hex');
  return a.length === b.length && timingSafeEqual(a, b);
}

/** The secret as Mosquitto's password file keeps it: `$7$iterations$salt$hash`, PBKDF2-SHA512 (mosquitto_passwd's format). */
export function brokerPasswordHash(secret: string, salt = randomBytes(12), iterations = 101): string {
  const hash = pbkdf2Sync(secret, salt, iterations, 64, 'sha512');
  return `$7$${iterations}$${salt.toString('base64')}$${hash.toString('base64')}`;
}
