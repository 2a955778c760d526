import { formatCelsius, formatDateTime } from '../../../lib/format';
import { freezeWords } from '../../../lib/freeze-words';
import { OUTCOME_LABELS, settledByWords } from '../lib/episode-words';
import type { Episode } from '../types';

/** A key, power or contact event (GET /api/units/:id/timeline). */
export interface HistoryEvent {
  at: string;
  kind: string;
  detail: string | null;
}

const EVENT_LABELS: Record<string, string> = {
  keyOn: 'Key on',
  keyOff: 'Key off',
  supplyLost: 'Supply lost',
  supplyRestored: 'Supply restored',
  boot: 'Gateway restarted',
  online: 'Gateway connected',
  offline: 'Gateway disconnected',
};

// One shape per outcome so it reads without colour: check, triangle, return arrow, question mark, hourglass.
const OUTCOME_LOOK: Record<Episode['outcome'], { tone: string; mark: string }> = {
  completed: { tone: 'border-state-safe/60 text-state-safe', mark: '✓' },
  interrupted: { tone: 'border-state-interrupted/70 text-state-interrupted', mark: '▲' },
  resumed: { tone: 'border-state-keyon/60 text-state-keyon', mark: '↺' },
  undetermined: { tone: 'border-state-nocontact/60 text-state-nocontact', mark: '?' },
  pending: { tone: 'border-state-purging/60 text-state-purging', mark: '⧗' },
};

function EpisodeCard({ e, lossThresholdV }: { e: Episode; lossThresholdV?: number }) {
  const look = OUTCOME_LOOK[e.outcome];
  return (
    <div id={`episode-${e.id}`} data-episode-outcome={e.outcome} className="rounded-md border border-line bg-raised/50 px-4 py-3">
      <div className="flex flex-wrap items-center gap-3">
        <span className={`inline-flex items-center gap-2 rounded-md border px-2.5 py-0.5 text-lg font-semibold ${look.tone}`}>
          <span aria-hidden="true">{look.mark}</span>
          {OUTCOME_LABELS[e.outcome]}
        </span>
        <span className="text-muted">{settledByWords(e, lossThresholdV)}</span>
        {e.final === false && e.outcome !== 'pending' && <span className="text-sm text-muted">(may still change: a message is missing)</span>}
      </div>
      <dl className="mt-2 grid grid-cols-2 gap-x-6 gap-y-1 text-sm sm:grid-cols-4">
        <div>
          <dt className="text-muted">Purge length</dt>
          <dd className="font-mono tabular-nums">{e.purgeSeconds} s</dd>
        </div>
        {e.outcome === 'interrupted' && (
          <div>
            <dt className="text-muted">Into the purge</dt>
            <dd className="font-mono tabular-nums">{e.secondsIntoPurge === null ? '—' : `${e.secondsIntoPurge.toFixed(1)} s`}</dd>
          </div>
        )}
        <div>
          <dt className="text-muted">Ambient at key-off</dt>
          <dd className="font-mono tabular-nums">{formatCelsius(e.ambientC)}</dd>
        </div>
        {e.outcome === 'interrupted' && (
          <div>
            <dt className="text-muted">Freeze exposure</dt>
            <dd>
              {freezeWords(e.freezeExposure)}
              {e.minAmbientAfterC !== null && <span className="text-muted"> · low {formatCelsius(e.minAmbientAfterC)}</span>}
            </dd>
          </div>
        )}
        {e.endedAt && (
          <div>
            <dt className="text-muted">Ended</dt>
            <dd>{formatDateTime(e.endedAt)}</dd>
          </div>
        )}
        {e.evidence && (
          <div>
            <dt className="text-muted">Evidence</dt>
            <dd className="font-mono text-xs tabular-nums">
              stream {e.evidence.stream} · boot {e.evidence.boot} · seq {e.evidence.seq}
            </dd>
          </div>
        )}
      </dl>
    </div>
  );
}

type Item = { at: number; episode: Episode } | { at: number; event: HistoryEvent };

/** Key, power and contact events interleaved with the purge episodes that start at each key-off, newest first. */
export function UnitHistory({ events, episodes, lossThresholdV }: { events: HistoryEvent[]; episodes: Episode[]; lossThresholdV?: number }) {
  const items: Item[] = [
    ...events.map((event) => ({ at: Date.parse(event.at), event })),
    // An episode sorts just after its own key-off event (newest first: above it).
    ...episodes.map((episode) => ({ at: Date.parse(episode.keyOffAt) + 0.5, episode })),
  ].sort((a, b) => b.at - a.at);
  if (items.length === 0) return <p className="py-6 text-center text-muted">Nothing recorded in this range.</p>;
  return (
    <ol aria-label="Timeline" className="flex flex-col gap-2">
      {items.map((it) =>
        'episode' in it ? (
          <li key={`e${it.episode.id}`} className="ml-6">
            <EpisodeCard e={it.episode} lossThresholdV={lossThresholdV} />
          </li>
        ) : (
          <li key={`t${it.event.at}${it.event.kind}`} className="flex items-baseline gap-4 border-l-2 border-line pl-4">
            <span className="w-48 shrink-0 font-mono text-sm tabular-nums text-muted">{formatDateTime(it.event.at)}</span>
            <span className="font-medium">{EVENT_LABELS[it.event.kind] ?? it.event.kind}</span>
            {it.event.detail && <span className="text-sm text-muted">{it.event.detail}</span>}
          </li>
        ),
      )}
    </ol>
  );
}
