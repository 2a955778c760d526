import { mkdir, readFile, rename, writeFile } from 'node:fs/promises';
import { dirname } from 'node:path';
import { TruthSchema, type Truth } from './truth-schema';

export async function writeTruth(path: string, truth: Truth): Promise<void> {
  const checked = TruthSchema.parse(truth);
  await mkdir(dirname(path), { recursive: true });
  const tmp = `${path}.tmp`;
  await writeFile(tmp, `${JSON.stringify(checked, null, 1)}\n`);
  await rename(tmp, path);
}

export async function readTruth(path: string): Promise<Truth> {
  let text: string;
  try {
    text = await readFile(path, 'utf8');
  } catch (err) {
    throw new Error(`cannot read the truth file ${path}: ${(err as Error).message}`);
  }
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch {
    throw new Error(`${path} is not JSON`);
  }
  const parsed = TruthSchema.safeParse(json);
  if (!parsed.success) throw new Error(`${path} is not a simulator truth file: ${parsed.error.issues.slice(0, 3).map((i) => `${i.path.join('.')}: ${i.message}`).join('; ')}`);
  return parsed.data;
}
