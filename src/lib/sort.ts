export type SortDirection = 'asc' | 'desc';
export interface SortState<K extends string = string> {
  key: K;
  direction: SortDirection;
}
export type SortValue = string | number | null | undefined;

const collator = new Intl.Collator(undefined, { numeric: true, sensitivity: 'base' });

/** Compares two cell values; empty values (null, undefined, '') always sort last, whichever the direction. */
export function compareValues(a: SortValue, b: SortValue, direction: SortDirection): number {
  const aEmpty = a === null || a === undefined || a === '';
  const bEmpty = b === null || b === undefined || b === '';
  if (aEmpty || bEmpty) return aEmpty === bEmpty ? 0 : aEmpty ? 1 : -1;
  const base = typeof a === 'number' && typeof b === 'number' ? a - b : collator.compare(String(a), String(b));
  return direction === 'asc' ? base : -base;
}

/** A sorted copy; stable, so equal rows keep their order. */
export function sortRows<T>(rows: readonly T[], value: (row: T) => SortValue, direction: SortDirection): T[] {
  return rows
    .map((row, index) => ({ row, index }))
    .sort((x, y) => compareValues(value(x.row), value(y.row), direction) || x.index - y.index)
    .map((x) => x.row);
}

/** Clicking a header: a new column sorts ascending, the same column flips. */
export function nextSort<K extends string>(current: SortState<K> | null, key: K): SortState<K> {
  if (current && current.key === key) return { key, direction: current.direction === 'asc' ? 'desc' : 'asc' };
  return { key, direction: 'asc' };
}
