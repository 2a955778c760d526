import { CONTROL_CLASS } from '../../../components/ui/depot-select';
import { OUTCOMES } from '../../../../shared/api/history';
import type { HistoryFilters } from '../lib/history-params';
import { OUTCOME_WORDS } from '../lib/words';

const control = CONTROL_CLASS;

export interface HistoryFiltersProps {
  filters: HistoryFilters;
  depots: string[];
  units: { id: string; name: string; depot: string }[];
  drivers: { id: number; name: string; code: string }[];
  /** Receives only what changed; the page merges it with the latest filters. */
  onChange: (patch: Partial<HistoryFilters>) => void;
}

function Select({ label, value, onChange, options, all }: { label: string; value: string; onChange: (v: string) => void; options: { value: string; label: string }[]; all: string }) {
  return (
    <label className="flex flex-col gap-1 text-sm font-medium text-muted">
      {label}
      <select value={value} onChange={(e) => onChange(e.target.value)} className={control}>
        <option value="">{all}</option>
        {options.map((o) => (
          <option key={o.value} value={o.value}>
            {o.label}
          </option>
        ))}
      </select>
    </label>
  );
}

/** Every change returns to page 1: the old page number means nothing under a new filter. */
export function HistoryFiltersBar({ filters, depots, units, drivers, onChange }: HistoryFiltersProps) {
  const set = (patch: Partial<HistoryFilters>) => onChange({ ...patch, page: 1 });
  const shownUnits = filters.depot ? units.filter((u) => u.depot === filters.depot) : units;
  return (
    <div role="search" aria-label="History filters" className="mb-4 flex flex-wrap items-end gap-3">
      <Select label="Depot" value={filters.depot} all="All depots" onChange={(depot) => set({ depot, unitId: '' })} options={depots.map((d) => ({ value: d, label: d }))} />
      <Select label="Unit" value={filters.unitId} all="All units" onChange={(unitId) => set({ unitId })} options={shownUnits.map((u) => ({ value: u.id, label: `${u.id} · ${u.name}` }))} />
      <Select label="Driver" value={filters.driverId} all="All drivers" onChange={(driverId) => set({ driverId })} options={drivers.map((d) => ({ value: String(d.id), label: `${d.name} (${d.code})` }))} />
      {filters.view === 'episodes' ? (
        <Select label="Outcome" value={filters.outcome} all="All outcomes" onChange={(outcome) => set({ outcome })} options={OUTCOMES.map((o) => ({ value: o, label: OUTCOME_WORDS[o] }))} />
      ) : (
        <Select label="Explained by an interruption" value={filters.linked} all="All faults" onChange={(linked) => set({ linked })} options={[{ value: 'yes', label: 'Yes' }, { value: 'no', label: 'No' }]} />
      )}
      <label className="flex flex-col gap-1 text-sm font-medium text-muted">
        From (UTC day)
        <input type="date" value={filters.fromDay} onChange={(e) => set({ fromDay: e.target.value })} className={control} />
      </label>
      <label className="flex flex-col gap-1 text-sm font-medium text-muted">
        To (UTC day, inclusive)
        <input type="date" value={filters.toDay} onChange={(e) => set({ toDay: e.target.value })} className={control} />
      </label>
    </div>
  );
}
