import { createHash, randomBytes, timingSafeEqual } from 'node:crypto';

/** 256 random bits: a token this strong needs no slow hash, SHA-256 is enough. */
export const newGatewaySecret = () => randomBytes(32).toString('base64url');
export const hashGatewaySecret = (secret: string) => createHash('sha256').update(secret, 'utf8').digest('hex');

export function secretMatches(secret: string, hash: string): boolean {
  const a = Buffer.from(hashGatewaySecret(secret), 'hex');
  const b = Buffer.from(hash, 'hex');
  return a.length === b.length && timingSafeEqual(a, b);
}
