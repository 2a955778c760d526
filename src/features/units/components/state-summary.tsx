import { StateGlyph } from '../../../components/ui/state-glyph';
import { NO_DATA_LABEL, STATE_LABELS } from '../../../lib/unit-state';
import type { StateCounts } from '../lib/count-states';
import type { StateFilter } from '../lib/filter-units';

// Wall-screen order: what needs a person first.
const ORDER: StateFilter[] = ['interrupted', 'purging', 'noContact', 'safeToIsolate', 'keyOn', 'isolated', 'none'];

const tone: Record<StateFilter, string> = {
  interrupted: 'text-state-interrupted',
  purging: 'text-state-purging',
  noContact: 'text-state-nocontact',
  safeToIsolate: 'text-state-safe',
  keyOn: 'text-state-keyon',
  isolated: 'text-state-isolated',
  none: 'text-state-nodata',
};

export interface StateSummaryProps {
  counts: StateCounts;
  selected: StateFilter | null;
  onSelect: (state: StateFilter | null) => void;
}

/** One large tile per state with its count; choosing a tile filters the table to that state. */
export function StateSummary({ counts, selected, onSelect }: StateSummaryProps) {
  return (
    <ul aria-label="Units by state" className="mb-6 grid grid-cols-2 gap-3 sm:grid-cols-4 xl:grid-cols-7">
      {ORDER.filter((s) => s !== 'none' || counts.none > 0).map((s) => {
        const active = selected === s;
        const label = s === 'none' ? NO_DATA_LABEL : STATE_LABELS[s];
        return (
          <li key={s}>
            <button
              type="button"
              aria-pressed={active}
              onClick={() => onSelect(active ? null : s)}
              className={`flex h-full w-full flex-col justify-between gap-1 rounded-lg border bg-panel px-4 py-3 text-left transition-colors hover:bg-raised ${
                active ? 'border-accent ring-1 ring-accent' : 'border-line'
              } ${counts[s] === 0 ? 'opacity-60' : ''}`}
            >
              <span className={`flex items-center gap-2 text-base font-semibold ${tone[s]}`}>
                <StateGlyph state={s === 'none' ? null : s} className="h-5 w-5" />
                {label}
              </span>
              <span className="font-mono text-4xl font-medium tabular-nums text-fg">{counts[s]}</span>
            </button>
          </li>
        );
      })}
    </ul>
  );
}
