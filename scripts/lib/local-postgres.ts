// The project's own PostgreSQL cluster on loopback, from Debian's server binaries.
// initdb and postgres refuse to run as root, so as root they run as an unprivileged system user.
import { execFileSync, spawn, type ChildProcess } from 'node:child_process';
import { chmodSync, existsSync, mkdirSync, readFileSync, writeFileSync, chownSync } from 'node:fs';
import { createServer } from 'node:net';
import { join, resolve } from 'node:path';

export const PG_SYSTEM_USER = 'afterwatch-pg';
const BIN_CANDIDATES = ['/usr/lib/postgresql/15/bin', '/usr/lib/postgresql/16/bin', '/usr/lib/postgresql/17/bin'];

export class PostgresMissingError extends Error {}

export function findPgBin(): string {
  const found = BIN_CANDIDATES.find((dir) => existsSync(join(dir, 'postgres')) && existsSync(join(dir, 'initdb')));
  if (!found) {
    throw new PostgresMissingError(
      'PostgreSQL server binaries were not found (looked in /usr/lib/postgresql/15/bin). ' +
        'Install them as root with: apt-get install -y postgresql   (or set DATABASE_URL to a running server).',
    );
  }
  return found;
}

export async function freePort(): Promise<number> {
  return new Promise((res, rej) => {
    const srv = createServer();
    srv.unref();
    srv.on('error', rej);
    srv.listen(0, '127.0.0.1', () => {
      const addr = srv.address();
      const port = typeof addr === 'object' && addr ? addr.port : 0;
      srv.close(() => res(port));
    });
  });
}

const isRoot = () => typeof process.getuid === 'function' && process.getuid() === 0;

function ensureSystemUser(): { uid: number; gid: number } | null {
  if (!isRoot()) return null;
  try {
    execFileSync('id', ['-u', PG_SYSTEM_USER], { stdio: 'ignore' });
  } catch {
    execFileSync('useradd', ['--system', '--no-create-home', '--shell', '/usr/sbin/nologin', PG_SYSTEM_USER], { stdio: 'inherit' });
  }
  const uid = Number(execFileSync('id', ['-u', PG_SYSTEM_USER]).toString().trim());
  const gid = Number(execFileSync('id', ['-g', PG_SYSTEM_USER]).toString().trim());
  return { uid, gid };
}

/** Runs a server binary as the unprivileged user when we are root, as ourselves otherwise. */
function asPgUser(bin: string, args: string[]): [string, string[]] {
  return isRoot() ? ['runuser', ['-u', PG_SYSTEM_USER, '--', bin, ...args]] : [bin, args];
}

/** Every folder from / down to `dir` must be traversable by the server's user (mkdtemp makes 0700). */
function openPath(dir: string) {
  let p = resolve(dir);
  while (p !== '/') {
    try {
      const mode = execFileSync('stat', ['-c', '%a', p]).toString().trim();
      const m = parseInt(mode, 8);
      if ((m & 0o001) === 0) chmodSync(p, m | 0o011);
    } catch {
      /* a folder we cannot stat is left alone */
    }
    p = resolve(p, '..');
  }
}

export interface LocalPostgres {
  url: string;
  port: number;
  stop(): Promise<void>;
}

export interface StartOptions {
  /** The cluster lives in `${dataDir}/pg`; its socket in `${dataDir}/pg-socket`. */
  dataDir: string;
  port?: number;
  database?: string;
  log?: (msg: string) => void;
}

export async function startLocalPostgres(opts: StartOptions): Promise<LocalPostgres> {
  const bin = findPgBin();
  const log = opts.log ?? (() => {});
  const dataDir = resolve(opts.dataDir);
  const pgData = join(dataDir, 'pg');
  const socketDir = join(dataDir, 'pg-socket');
  mkdirSync(dataDir, { recursive: true });
  mkdirSync(socketDir, { recursive: true });
  const ids = ensureSystemUser();
  openPath(dataDir);
  if (ids) chownSync(socketDir, ids.uid, ids.gid);

  if (!existsSync(join(pgData, 'PG_VERSION'))) {
    mkdirSync(pgData, { recursive: true });
    if (ids) chownSync(pgData, ids.uid, ids.gid);
    chmodSync(pgData, 0o700);
    log(`initialising a PostgreSQL cluster in ${pgData}`);
    const [cmd, args] = asPgUser(join(bin, 'initdb'), ['-D', pgData, '-U', 'postgres', '--auth=trust', '-E', 'UTF8', '--locale=C.UTF-8']);
    execFileSync(cmd, args, { stdio: ['ignore', 'ignore', 'inherit'] });
  }
  // A stale pid file from a killed run would stop the server from starting.
  const pidFile = join(pgData, 'postmaster.pid');
  if (existsSync(pidFile)) {
    const pid = Number(readFileSync(pidFile, 'utf8').split('\n')[0]);
    let alive = false;
    try {
      process.kill(pid, 0);
      alive = true;
    } catch {
      /* not running */
    }
    if (alive) throw new Error(`PostgreSQL already runs on ${pgData} (pid ${pid}); stop it or set DATABASE_URL`);
    writeFileSync(pidFile, '');
  }
  const port = opts.port ?? (await freePort());
  const [cmd, args] = asPgUser(join(bin, 'postgres'), [
    '-D', pgData, '-k', socketDir, '-h', '127.0.0.1', '-p', String(port),
    '-c', 'fsync=on', '-c', 'max_connections=200', '-c', 'shared_buffers=128MB',
  ]);
  const child: ChildProcess = spawn(cmd, args, { stdio: ['ignore', 'ignore', 'pipe'], detached: false });
  let stderr = '';
  child.stderr?.on('data', (d) => {
    stderr = (stderr + d.toString()).slice(-4000);
  });
  await waitReady(bin, port, child, () => stderr);
  const database = opts.database ?? 'afterwatch';
  ensureDatabase(bin, port, database);
  log(`PostgreSQL ready on 127.0.0.1:${port}`);
  let stopped = false;
  return {
    port,
    url: `postgres://postgres@127.0.0.1:${port}/${database}`,
    async stop() {
      if (stopped) return;
      stopped = true;
      const [c, a] = asPgUser(join(bin, 'pg_ctl'), ['stop', '-D', pgData, '-m', 'fast', '-w']);
      try {
        execFileSync(c, a, { stdio: 'ignore' });
      } catch {
        child.kill('SIGINT');
      }
    },
  };
}

async function waitReady(bin: string, port: number, child: ChildProcess, stderr: () => string) {
  const deadline = Date.now() + 30_000;
  while (Date.now() < deadline) {
    if (child.exitCode !== null) throw new Error(`PostgreSQL exited at start-up:\n${stderr()}`);
    try {
      execFileSync(join(bin, 'pg_isready'), ['-h', '127.0.0.1', '-p', String(port), '-q'], { stdio: 'ignore' });
      return;
    } catch {
      await new Promise((r) => setTimeout(r, 150));
    }
  }
  throw new Error(`PostgreSQL did not become ready on port ${port}:\n${stderr()}`);
}

function psql(bin: string, port: number, sql: string, db = 'postgres'): string {
  const psqlBin = existsSync(join(bin, 'psql')) ? join(bin, 'psql') : 'psql';
  return execFileSync(psqlBin, ['-h', '127.0.0.1', '-p', String(port), '-U', 'postgres', '-d', db, '-tAc', sql]).toString().trim();
}

export function ensureDatabase(bin: string, port: number, database: string) {
  const exists = psql(bin, port, `SELECT 1 FROM pg_database WHERE datname = '${database.replace(/'/g, "''")}'`);
  if (exists !== '1') psql(bin, port, `CREATE DATABASE "${database.replace(/"/g, '')}"`);
}
