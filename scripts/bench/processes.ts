// Child processes of the benchmark and what they cost: CPU seconds and peak resident memory from /proc.
import { spawn, execFileSync, type ChildProcess } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { SERVICE_NODE_FLAGS } from '../lib/service-node-flags';

const TICK = 100; // USER_HZ on Linux
/** Flags given in an environment variable, space-separated. */
const flagsIn = (value: string) => value.split(/\s+/).filter(Boolean);
// `BENCH_CPU_PROF=dir` writes a V8 CPU profile of every process the benchmark starts into dir.
const profile = [
  ...(process.env.BENCH_CPU_PROF ? ['--cpu-prof', `--cpu-prof-dir=${process.env.BENCH_CPU_PROF}`] : []),
  // `BENCH_NODE_FLAGS="--flag …"`: more flags for every process (to try a V8 setting).
  ...flagsIn(process.env.BENCH_NODE_FLAGS ?? ''),
];

export function cpuSeconds(pid: number): number {
  try {
    const fields = readFileSync(`/proc/${pid}/stat`, 'utf8').split(') ')[1].split(' ');
    return (Number(fields[11]) + Number(fields[12])) / TICK; // utime + stime
  } catch {
    return 0;
  }
}

export function peakRssMb(pid: number): number {
  try {
    const m = /VmHWM:\s+(\d+) kB/.exec(readFileSync(`/proc/${pid}/status`, 'utf8'));
    return m ? Number(m[1]) / 1024 : 0;
  } catch {
    return 0;
  }
}

/** CPU of the whole cluster: the postmaster with its reaped children (cutime, cstime) plus the live backends. */
export function postgresCpu(user: string): number {
  let total = 0;
  for (const pid of postgresPids(user)) {
    try {
      const f = readFileSync(`/proc/${pid}/stat`, 'utf8').split(') ')[1].split(' ');
      const isPostmaster = Number(f[1]) !== 0 && !postgresPids(user).includes(Number(f[1]));
      total += (Number(f[11]) + Number(f[12]) + (isPostmaster ? Number(f[13]) + Number(f[14]) : 0)) / TICK;
    } catch {
      /* gone meanwhile */
    }
  }
  return total;
}

/** Every PostgreSQL process of the benchmark's cluster (they run as the cluster's system user). */
export function postgresPids(user: string): number[] {
  try {
    return execFileSync('pgrep', ['-u', user, 'postgres']).toString().trim().split('\n').filter(Boolean).map(Number);
  } catch {
    return [];
  }
}

export const sumCpu = (pids: number[]) => pids.reduce((s, p) => s + cpuSeconds(p), 0);

/** A process and its descendants. */
export function processTree(pid: number): number[] {
  const out = [pid];
  for (let i = 0; i < out.length; i++) {
    try {
      out.push(...execFileSync('pgrep', ['-P', String(out[i])]).toString().trim().split('\n').filter(Boolean).map(Number));
    } catch {
      /* no children */
    }
  }
  return out;
}

export const treeCpu = (pid: number) => sumCpu(processTree(pid));
export const treePeakRssMb = (pid: number) => Math.max(...processTree(pid).map(peakRssMb));

export interface Child {
  proc: ChildProcess;
  output(): string;
  exited: Promise<number | null>;
  stop(): Promise<void>;
}

/**
 * The service's own flags (what `npm start` gives it); `BENCH_SERVICE_FLAGS="…"` in their place, to compare
 * (an empty value runs the service with V8's defaults).
 */
const serviceFlags = process.env.BENCH_SERVICE_FLAGS !== undefined ? flagsIn(process.env.BENCH_SERVICE_FLAGS) : SERVICE_NODE_FLAGS;

/** The service (`server/index.ts`), started with its own Node flags. */
export const spawnService = (env: Record<string, string>): Child => spawnNode([...serviceFlags, ...profile], 'server/index.ts', [], env);

export const spawnTs = (script: string, args: string[], env: Record<string, string>, onLine?: (line: string) => void): Child =>
  spawnNode(profile, script, args, env, onLine);

function spawnNode(flags: string[], script: string, args: string[], env: Record<string, string>, onLine?: (line: string) => void): Child {
  // tsx as a loader: one process per script, so its CPU and memory are the script's own.
  const proc = spawn(process.execPath, [...flags, '--import', 'tsx', script, ...args], { env: { ...process.env, ...env }, stdio: ['ignore', 'pipe', 'pipe'] });
  let out = '';
  let partial = '';
  proc.stdout!.on('data', (d: Buffer) => {
    out = (out + d).slice(-200_000);
    partial += d.toString();
    const lines = partial.split('\n');
    partial = lines.pop()!;
    for (const l of lines) onLine?.(l);
  });
  proc.stderr!.on('data', (d: Buffer) => (out = (out + d).slice(-200_000)));
  const exited = new Promise<number | null>((res) => proc.once('exit', (code) => res(code)));
  return {
    proc,
    output: () => out,
    exited,
    async stop() {
      if (proc.exitCode !== null) return;
      proc.kill('SIGTERM');
      const t = setTimeout(() => proc.kill('SIGKILL'), 10_000);
      await exited;
      clearTimeout(t);
    },
  };
}

export async function waitFor(check: () => Promise<boolean>, timeoutMs: number, what: string) {
  const end = Date.now() + timeoutMs;
  while (Date.now() < end) {
    if (await check().catch(() => false)) return;
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error(`timed out waiting for ${what}`);
}
