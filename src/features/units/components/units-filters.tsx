import { CONTROL_CLASS } from '../../../components/ui/depot-select';
import { STATE_LABELS, NO_DATA_LABEL, UNIT_STATES } from '../../../lib/unit-state';
import type { StateFilter, UnitFilters } from '../lib/filter-units';
import type { UnitFiltersChange } from '../lib/use-unit-filters';

const control = CONTROL_CLASS;

export interface UnitsFiltersProps {
  filters: UnitFilters;
  depots: string[];
  onChange: (change: UnitFiltersChange) => void;
}

export function UnitsFilters({ filters, depots, onChange }: UnitsFiltersProps) {
  return (
    <div role="search" className="mb-4 flex flex-wrap items-end gap-3">
      <label className="flex flex-col gap-1 text-sm font-medium text-muted">
        Search
        <input
          type="search"
          placeholder="Unit id or name"
          value={filters.query}
          onChange={(e) => onChange({ query: e.target.value })}
          className={`${control} w-64`}
        />
      </label>
      <label className="flex flex-col gap-1 text-sm font-medium text-muted">
        Depot
        <select
          value={filters.depot ?? ''}
          onChange={(e) => onChange({ depot: e.target.value || null })}
          className={control}
        >
          <option value="">All depots</option>
          {depots.map((d) => (
            <option key={d} value={d}>
              {d}
            </option>
          ))}
        </select>
      </label>
      <label className="flex flex-col gap-1 text-sm font-medium text-muted">
        State
        <select
          value={filters.state ?? ''}
          onChange={(e) => onChange({ state: (e.target.value || null) as StateFilter | null })}
          className={control}
        >
          <option value="">All states</option>
          {UNIT_STATES.map((s) => (
            <option key={s} value={s}>
              {STATE_LABELS[s]}
            </option>
          ))}
          <option value="none">{NO_DATA_LABEL}</option>
        </select>
      </label>
    </div>
  );
}
