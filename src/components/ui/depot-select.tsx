/** The look of the planner pages' small form controls (selects, week and date inputs). */
export const CONTROL_CLASS = 'rounded-md border border-line bg-raised px-3 py-2 text-base text-fg focus:border-accent focus:outline-none';

/** A labelled depot filter, "All depots" first; the pages keep the value (usually in the address). */
export function DepotSelect({ value, depots, onChange, className = CONTROL_CLASS }: { value: string; depots: readonly string[]; onChange: (depot: string) => void; className?: string }) {
  return (
    <label className="flex flex-col gap-1 text-sm font-medium text-muted">
      Depot
      <select value={value} onChange={(e) => onChange(e.target.value)} className={className}>
        <option value="">All depots</option>
        {depots.map((d) => <option key={d} value={d}>{d}</option>)}
      </select>
    </label>
  );
}
