import { mkdir, readFile, rename, writeFile } from 'node:fs/promises';
import { dirname, join } from 'node:path';
import { z } from 'zod';

// The simulated gateways' credentials, kept under DATA_DIR so a second start reuses them.
// The file holds secrets: it is written with mode 0600.

const StoredGatewaySchema = z.object({
  gatewayId: z.string(),
  secret: z.string().min(1),
  /** The boot counter for the gateway's next power-up. */
  nextBoot: z.number().int().nonnegative(),
});
export type StoredGateway = z.infer<typeof StoredGatewaySchema>;
const FileSchema = z.object({ version: z.literal(1), gateways: z.record(z.string(), StoredGatewaySchema) });

export const gatewayStorePath = (dataDir: string): string => join(dataDir, 'sim-gateways.json');

export async function loadGatewayStore(path: string): Promise<Map<string, StoredGateway>> {
  let text: string;
  try {
    text = await readFile(path, 'utf8');
  } catch (err) {
    if ((err as NodeJS.ErrnoException).code === 'ENOENT') return new Map();
    throw err;
  }
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch {
    throw new Error(`${path} is not JSON; delete it to provision new gateways`);
  }
  const parsed = FileSchema.safeParse(json);
  if (!parsed.success) throw new Error(`${path} is not a simulator gateway file: ${parsed.error.message}`);
  return new Map(Object.entries(parsed.data.gateways));
}

export async function saveGatewayStore(path: string, gateways: ReadonlyMap<string, StoredGateway>): Promise<void> {
  await mkdir(dirname(path), { recursive: true });
  const body = { version: 1, gateways: Object.fromEntries([...gateways].sort(([a], [b]) => a.localeCompare(b))) };
  const tmp = `${path}.tmp`;
  await writeFile(tmp, `${JSON.stringify(body, null, 2)}\n`, { mode: 0o600 });
  await rename(tmp, path);
}
