import type { SendStats } from '../net/gateway-client';

export interface ProgressSource {
  stats: SendStats;
  simNow: number;
}

/**
 * A plain progress line on stderr: a bar when the total is known, counts and simulated time always.
 * On a terminal it redraws in place; otherwise it prints a line now and then (for logs).
 */
export function startProgress(src: ProgressSource, total: number | null, opts: { stream?: NodeJS.WriteStream; everyMs?: number } = {}) {
  const out = opts.stream ?? process.stderr;
  const tty = out.isTTY === true;
  const started = Date.now();
  let lastAcked = 0;
  let lastAt = started;
  const render = (): string => {
    const s = src.stats;
    const now = Date.now();
    const rate = ((s.acked - lastAcked) * 1000) / Math.max(1, now - lastAt);
    lastAcked = s.acked;
    lastAt = now;
    const sim = new Date(src.simNow).toISOString().slice(0, 19).replace('T', ' ');
    let bar = '';
    if (total !== null && total > 0) {
      const f = Math.min(1, s.acked / total);
      const width = 30;
      const full = Math.round(f * width);
      bar = `[${'#'.repeat(full)}${'.'.repeat(width - full)}] ${(f * 100).toFixed(0).padStart(3)}% `;
    }
    return `${bar}${s.acked}${total !== null ? `/${total}` : ''} acked, ${Math.round(rate)}/s, sim ${sim}Z`;
  };
  const timer = setInterval(() => {
    const line = render();
    out.write(tty ? `\r${line}\x1b[K` : `${line}\n`);
  }, opts.everyMs ?? (tty ? 250 : 10_000));
  timer.unref();
  return {
    stop(): void {
      clearInterval(timer);
      if (tty) out.write(`\r${render()}\x1b[K\n`);
    },
    elapsedMs: () => Date.now() - started,
  };
}

export function formatSummary(stats: SendStats, elapsedMs: number, extra: Record<string, string | number>): string {
  const secs = elapsedMs / 1000;
  const lines = [
    `messages published ${stats.published} (of which duplicates ${stats.duplicates}), acknowledged ${stats.acked}, failed ${stats.errors}`,
    `connections ${stats.connects}, unplanned reconnect attempts ${stats.reconnects}`,
    `wall time ${secs.toFixed(1)} s, ${Math.round(stats.acked / Math.max(secs, 0.001))} messages/s`,
    ...Object.entries(extra).map(([k, v]) => `${k}: ${v}`),
  ];
  return lines.join('\n');
}
