import type { ReactNode } from 'react';

const DEFAULT_TEXT =
  "Open the battery isolator only once the unit shows 'Safe to isolate'. Afterwatch reports what the gateway saw; it does not replace the vehicle and engine manufacturers' procedures, your workshop's rules or local regulations. Follow those first.";

/** The caution shown wherever isolating a battery is in question. */
export function CautionNote({ children, className = '' }: { children?: ReactNode; className?: string }) {
  return (
    <aside
      role="note"
      aria-label="Caution"
      className={`flex items-start gap-3 rounded-md border border-caution/40 bg-caution/10 px-4 py-3 text-fg ${className}`}
    >
      <svg viewBox="0 0 20 20" aria-hidden="true" className="mt-0.5 h-5 w-5 shrink-0 text-caution">
        <path d="M10 2 19 18H1z" fill="none" stroke="currentColor" strokeWidth="2" strokeLinejoin="round" />
        <path d="M10 8v4.5M10 14.8v.4" stroke="currentColor" strokeWidth="2" strokeLinecap="round" />
      </svg>
      <p className="text-sm leading-relaxed">
        <span className="font-semibold text-caution">Caution. </span>
        {children ?? DEFAULT_TEXT}
      </p>
    </aside>
  );
}
