import { randomBytes } from 'node:crypto';
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';

/** JWT_SECRET if set; otherwise one made on first start and kept in DATA_DIR, so sessions survive a restart. */
export function resolveJwtSecret(configured: string | undefined, dataDir: string): string {
  if (configured) return configured;
  const file = join(dataDir, 'jwt-secret');
  if (existsSync(file)) return readFileSync(file, 'utf8').trim();
  mkdirSync(dataDir, { recursive: true });
  const secret = randomBytes(32).toString('base64url');
  writeFileSync(file, secret, { mode: 0o600 });
  return secret;
}
