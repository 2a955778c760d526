import { useEffect, useRef } from 'react';
import { useSearchParams } from 'react-router-dom';
import { readHistoryFilters, writeHistoryFilters, type HistoryFilters } from './history-params';

/**
 * The filters in the address, with changes that build on each other: two changes made before the
 * address has caught up (two selects in quick succession) both count, instead of the second one
 * starting again from the address of the last render.
 */
export function useHistoryFilters() {
  const [params, setParams] = useSearchParams();
  const filters = readHistoryFilters(params);
  const pending = useRef<HistoryFilters | null>(null);
  // Cleared after a commit, not during render: a navigation's render may be thrown away before it commits.
  const qs = params.toString();
  useEffect(() => {
    if (pending.current && writeHistoryFilters(pending.current).toString() === qs) pending.current = null;
  }, [qs]);
  const update = (patch: Partial<HistoryFilters>) => {
    const next = { ...(pending.current ?? filters), ...patch };
    pending.current = next;
    setParams(writeHistoryFilters(next), { replace: true });
  };
  return { filters, update };
}
