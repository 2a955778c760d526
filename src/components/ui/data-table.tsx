import type { ReactNode } from 'react';
import type { SortState } from '../../lib/sort';
import { PlainBody, VirtualBody, type BodyProps } from './data-table-body';

export interface Column<T> {
  key: string;
  header: string;
  cell: (row: T) => ReactNode;
  /** Set to make the column sortable through `onSortChange`. */
  sortable?: boolean;
  align?: 'left' | 'right';
  className?: string;
}

export interface DataTableProps<T> {
  columns: Column<T>[];
  rows: readonly T[];
  rowKey: (row: T) => string;
  caption?: string;
  sort?: SortState | null;
  onSortChange?: (key: string) => void;
  empty?: ReactNode;
  rowClassName?: (row: T) => string;
}

function SortMark({ direction }: { direction: 'asc' | 'desc' | null }) {
  return (
    <svg viewBox="0 0 10 14" aria-hidden="true" className="h-3.5 w-2.5 shrink-0">
      <path d="M5 1 9 5.5H1z" fill="currentColor" opacity={direction === 'asc' ? 1 : 0.25} />
      <path d="M5 13 1 8.5h8z" fill="currentColor" opacity={direction === 'desc' ? 1 : 0.25} />
    </svg>
  );
}

/** A plain, legible table; sorting is controlled by the page (so it can live in the URL). */
/** Above this many rows only the rows near the viewport are in the DOM (a wall of a whole fleet). */
const VIRTUALIZE_ABOVE = 150;

export function DataTable<T>({ columns, rows, rowKey, caption, sort, onSortChange, empty, rowClassName }: DataTableProps<T>) {
  const bodyProps: BodyProps<T> = { columns, rows, rowKey, rowClassName };
  return (
    <div className="overflow-x-auto rounded-lg border border-line">
      <table className="w-full border-collapse text-left">
        {caption && <caption className="sr-only">{caption}</caption>}
        <thead className="bg-raised text-sm uppercase tracking-wide text-muted">
          <tr>
            {columns.map((c) => {
              const active = sort?.key === c.key ? sort.direction : null;
              const align = c.align === 'right' ? 'text-right' : 'text-left';
              return (
                <th
                  key={c.key}
                  scope="col"
                  aria-sort={active === 'asc' ? 'ascending' : active === 'desc' ? 'descending' : undefined}
                  className={`whitespace-nowrap px-3 py-3 font-semibold ${align}`}
                >
                  {c.sortable && onSortChange ? (
                    <button
                      type="button"
                      onClick={() => onSortChange(c.key)}
                      className={`inline-flex items-center gap-1.5 uppercase tracking-wide hover:text-fg ${active ? 'text-fg' : ''}`}
                    >
                      {c.header}
                      <SortMark direction={active} />
                    </button>
                  ) : (
                    c.header
                  )}
                </th>
              );
            })}
          </tr>
        </thead>
        {rows.length === 0 ? (
          <tbody className="bg-panel">
            <tr>
              <td colSpan={columns.length} className="px-4 py-10 text-center text-lg text-muted">
                {empty ?? 'Nothing to show.'}
              </td>
            </tr>
          </tbody>
        ) : rows.length > VIRTUALIZE_ABOVE ? (
          <VirtualBody {...bodyProps} />
        ) : (
          <PlainBody {...bodyProps} />
        )}
      </table>
    </div>
  );
}
