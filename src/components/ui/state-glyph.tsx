import type { ReactElement } from 'react';
import type { UnitStateName } from '../../lib/unit-state';

// One shape per state, so the state reads without colour: disc, hourglass, ringed check,
// hollow square, warning triangle, broken ring, and a dash for "no data yet".
const paths: Record<UnitStateName | 'none', ReactElement> = {
  keyOn: <circle cx="12" cy="12" r="7" fill="currentColor" />,
  purging: (
    <path
      d="M6 3.5h12M6 20.5h12M7.5 3.5c0 4.5 4.5 6 4.5 8.5s-4.5 4-4.5 8.5M16.5 3.5c0 4.5-4.5 6-4.5 8.5s4.5 4 4.5 8.5"
      fill="none" stroke="currentColor" strokeWidth="2" strokeLinecap="round" strokeLinejoin="round"
    />
  ),
  safeToIsolate: (
    <g fill="none" stroke="currentColor" strokeWidth="2.2" strokeLinecap="round" strokeLinejoin="round">
      <circle cx="12" cy="12" r="9" />
      <path d="m7.5 12.3 3 3 6-6.3" />
    </g>
  ),
  isolated: <rect x="5" y="5" width="14" height="14" rx="1.5" fill="none" stroke="currentColor" strokeWidth="2.4" />,
  interrupted: (
    <g>
      <path d="M12 2.5 22 20.5H2z" fill="currentColor" />
      <path d="M12 9v5.5M12 17.2v.3" stroke="#10151c" strokeWidth="2.4" strokeLinecap="round" />
    </g>
  ),
  noContact: (
    <circle cx="12" cy="12" r="8" fill="none" stroke="currentColor" strokeWidth="2.4" strokeDasharray="4 3.2" />
  ),
  none: <path d="M6 12h12" stroke="currentColor" strokeWidth="2.4" strokeLinecap="round" />,
};

export function StateGlyph({ state, className = 'h-5 w-5' }: { state: UnitStateName | null; className?: string }) {
  return (
    <svg viewBox="0 0 24 24" aria-hidden="true" className={`shrink-0 ${className}`}>
      {paths[state ?? 'none']}
    </svg>
  );
}
