// The service as a real separate process (tsx server/index.ts), on fixed ports, that a test can kill -9 and start again.
import { spawn, type ChildProcess } from 'node:child_process';
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { freePort } from '../../scripts/lib/local-postgres';
import { ADMIN } from './service';

/** Whether the process holds a listening socket on the port (from /proc/net/tcp and its fds). */
async function portOwnedBy(pid: number, port: number): Promise<boolean> {
  const { readFileSync, readdirSync, readlinkSync } = await import('node:fs');
  const hex = port.toString(16).toUpperCase().padStart(4, '0');
  const inodes = new Set(
    readFileSync('/proc/net/tcp', 'utf8').split('\n').slice(1).map((l) => l.trim().split(/\s+/)).filter((f) => f[1]?.endsWith(`:${hex}`) && f[3] === '0A').map((f) => f[9]),
  );
  for (const fd of readdirSync(`/proc/${pid}/fd`)) {
    try {
      const m = /^socket:\[(\d+)\]$/.exec(readlinkSync(`/proc/${pid}/fd/${fd}`));
      if (m && inodes.has(m[1])) return true;
    } catch {
      /* closed meanwhile */
    }
  }
  return false;
}

export interface ServiceProcess {
  url: string;
  mqttUrl: string;
  start(): Promise<void>;
  kill9(): Promise<void>;
  stop(): Promise<void>;
  output(): string;
}

export async function serviceProcess(databaseUrl: string, env: Record<string, string> = {}): Promise<ServiceProcess> {
  const port = await freePort();
  const mqttPort = await freePort();
  const dataDir = mkdtempSync(join(tmpdir(), 'afterwatch-proc-'));
  let child: ChildProcess | null = null;
  let log = '';
  const url = `http://127.0.0.1:${port}`;
  const exited = (c: ChildProcess) => new Promise<void>((res) => (c.exitCode !== null || c.signalCode !== null ? res() : c.once('exit', () => res())));
  return {
    url,
    mqttUrl: `mqtt://127.0.0.1:${mqttPort}`,
    output: () => log,
    async start() {
      // tsx as a loader in the one process (its CLI would run the script in a child that kill -9 would miss).
      child = spawn(process.execPath, ['--import', 'tsx', 'server/index.ts'], {
        env: {
          PATH: process.env.PATH ?? '', HOME: process.env.HOME ?? '/root',
          DATABASE_URL: databaseUrl, PORT: String(port), MQTT_PORT: String(mqttPort), DATA_DIR: dataDir,
          ADMIN_EMAIL: ADMIN.email, ADMIN_PASSWORD: ADMIN.password, JWT_SECRET: 'test-secret-of-sufficient-length',
          LOG_LEVEL: 'warn', DEMO: 'off', ...env,
        },
        stdio: ['ignore', 'pipe', 'pipe'],
      });
      child.stdout?.on('data', (d) => (log = (log + d).slice(-20_000)));
      child.stderr?.on('data', (d) => (log = (log + d).slice(-20_000)));
      const deadline = Date.now() + 30_000;
      for (;;) {
        if (child.exitCode !== null) throw new Error(`service exited at start:\n${log}`);
        try {
          const res = await fetch(`${url}/api/health`);
          // Only this child's answer counts (a killed predecessor must not be mistaken for it).
          if (res.status === 200 && child.exitCode === null && (await portOwnedBy(child.pid!, port))) return;
        } catch {
          /* not up yet */
        }
        if (Date.now() > deadline) throw new Error(`service did not start:\n${log}`);
        await new Promise((r) => setTimeout(r, 100));
      }
    },
    async kill9() {
      if (!child) return;
      const c = child;
      c.kill('SIGKILL');
      await exited(c);
      child = null;
    },
    async stop() {
      if (!child) return;
      const c = child;
      c.kill('SIGTERM');
      await exited(c);
      child = null;
    },
  };
}
