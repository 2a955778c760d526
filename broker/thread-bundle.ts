// The broker thread's code as one JavaScript module, built with esbuild when the service first starts the
// thread. A worker starts without the service's TypeScript loader, and registering one there (tsx) cost
// the process about 18 MB more than the thread's own code: measured with a worker that only registers it
// (README, Performance). Packages stay imports (packages: 'external'), so the module is written inside
// node_modules, where Node resolves them as for any other module of the project.
import { createHash } from 'node:crypto';
import { mkdir, readFile, rename, writeFile } from 'node:fs/promises';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { build, stop } from 'esbuild';

const SOURCE = fileURLToPath(new URL('./broker-thread.ts', import.meta.url));
const OUT_DIR = fileURLToPath(new URL('../node_modules/.cache/afterwatch/', import.meta.url));

let built: Promise<URL> | undefined;

/**
 * The URL of the built module; built once a process, named by its content so that processes never share a
 * half-written file. esbuild runs its binary as a service process (and its synchronous calls a thread as
 * well) for the life of ours unless stopped, so it is stopped once the module is written.
 */
export function brokerThreadModule(): Promise<URL> {
  built ??= (async () => {
    try {
      const out = await build({ entryPoints: [SOURCE], bundle: true, platform: 'node', format: 'esm', target: 'node20', packages: 'external', write: false, logLevel: 'silent' });
      const code = out.outputFiles[0].contents;
      const file = `${OUT_DIR}broker-thread-${createHash('sha256').update(code).digest('hex').slice(0, 16)}.mjs`;
      const same = await readFile(file).then((b) => b.equals(code), () => false);
      if (!same) {
        await mkdir(OUT_DIR, { recursive: true });
        const partial = `${file}.${process.pid}.tmp`;
        await writeFile(partial, code);
        await rename(partial, file); // atomic: a reader sees the whole module or none
      }
      return pathToFileURL(file);
    } finally {
      await stop();
    }
  })();
  built.catch(() => (built = undefined)); // a failed build is tried again on the next start
  return built;
}
