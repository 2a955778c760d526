import type { LiveStatus } from '../../lib/live-socket';

const look: Record<LiveStatus, { text: string; tone: string; shape: 'dot' | 'ring' | 'bar' }> = {
  live: { text: 'Live', tone: 'text-state-safe border-state-safe/50', shape: 'dot' },
  connecting: { text: 'Connecting…', tone: 'text-muted border-line', shape: 'ring' },
  reconnecting: { text: 'Reconnecting…', tone: 'text-caution border-caution/60', shape: 'ring' },
  closed: { text: 'Offline', tone: 'text-muted border-line', shape: 'bar' },
};

/** The live feed's connection: a word and a shape (filled dot = live, spinning open ring = trying). */
export function LiveIndicator({ status }: { status: LiveStatus }) {
  const l = look[status];
  return (
    <span role="status" aria-live="polite" data-live={status} className={`inline-flex items-center gap-2 rounded-full border px-3 py-1 text-sm font-semibold ${l.tone}`}>
      <svg viewBox="0 0 12 12" aria-hidden="true" className={`h-3 w-3 ${l.shape === 'ring' ? 'animate-spin' : ''}`}>
        {l.shape === 'dot' && <circle cx="6" cy="6" r="5" fill="currentColor" />}
        {l.shape === 'ring' && <path d="M6 1a5 5 0 1 1-5 5" fill="none" stroke="currentColor" strokeWidth="2" strokeLinecap="round" />}
        {l.shape === 'bar' && <path d="M1.5 6h9" stroke="currentColor" strokeWidth="2" strokeLinecap="round" />}
      </svg>
      {l.text}
    </span>
  );
}
