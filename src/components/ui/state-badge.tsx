import { stateLabel, type UnitStateName } from '../../lib/unit-state';
import { StateGlyph } from './state-glyph';

// Colour classes are written out in full so Tailwind finds them.
const tone: Record<UnitStateName | 'none', string> = {
  keyOn: 'text-state-keyon border-state-keyon/50 bg-state-keyon/10',
  purging: 'text-state-purging border-state-purging/60 bg-state-purging/15',
  safeToIsolate: 'text-state-safe border-state-safe/60 bg-state-safe/12',
  isolated: 'text-state-isolated border-state-isolated/40 bg-state-isolated/8',
  interrupted: 'text-state-interrupted border-state-interrupted/70 bg-state-interrupted/15',
  noContact: 'text-state-nocontact border-state-nocontact/50 bg-state-nocontact/10',
  none: 'text-state-nodata border-state-nodata/40 bg-transparent',
};

const sizes = {
  sm: { box: 'gap-1.5 px-2 py-0.5 text-sm', glyph: 'h-4 w-4' },
  md: { box: 'gap-2 px-2.5 py-1 text-base', glyph: 'h-5 w-5' },
  lg: { box: 'gap-2.5 px-3.5 py-1.5 text-xl', glyph: 'h-6 w-6' },
  xl: { box: 'gap-3 px-4 py-2 text-3xl', glyph: 'h-9 w-9' },
} as const;

export interface StateBadgeProps {
  state: UnitStateName | null;
  size?: keyof typeof sizes;
  /** Extra words after the label, e.g. the purge countdown "1:34 left". */
  detail?: string;
  className?: string;
}

/** A unit's state as label + shape + colour, so no one has to tell colours apart. */
export function StateBadge({ state, size = 'md', detail, className = '' }: StateBadgeProps) {
  const s = sizes[size];
  return (
    <span
      data-state={state ?? 'none'}
      className={`inline-flex items-center whitespace-nowrap rounded-md border font-semibold leading-tight ${s.box} ${tone[state ?? 'none']} ${className}`}
    >
      <StateGlyph state={state} className={s.glyph} />
      <span>{stateLabel(state)}</span>
      {detail && <span className="font-mono font-medium tabular-nums opacity-90">{detail}</span>}
    </span>
  );
}
