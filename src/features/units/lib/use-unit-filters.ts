import { useAddressParams } from '../../../lib/use-address-params';
import { readUnitFilters, writeUnitFilters, type UnitFilters } from './filter-units';

export type UnitFiltersChange = Partial<UnitFilters> | ((current: UnitFilters) => UnitFilters);

/** The unit lists' filters, kept in the address; each change builds on the one before (see useAddressParams). */
export function useUnitFilters() {
  const address = useAddressParams();
  const update = (change: UnitFiltersChange) =>
    address.update((p) => {
      const current = readUnitFilters(p);
      return writeUnitFilters(typeof change === 'function' ? change(current) : { ...current, ...change });
    });
  return { filters: readUnitFilters(address.params), key: address.key, update };
}
