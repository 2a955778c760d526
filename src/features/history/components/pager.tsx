import { Button } from '../../../components/ui/button';
import { PAGE_SIZES } from '../lib/history-params';

export interface PagerProps {
  page: number;
  pageSize: number;
  total: number;
  /** More rows than `total` exist (the server stops counting at a cap). */
  capped?: boolean;
  onPage: (page: number) => void;
  onPageSize: (size: number) => void;
  /** The next page is on its way; the rows shown are still the previous page's. */
  loading?: boolean;
}

export function Pager({ page, pageSize, total, capped = false, onPage, onPageSize, loading = false }: PagerProps) {
  const pages = Math.max(1, Math.ceil(total / pageSize));
  const first = total === 0 ? 0 : (page - 1) * pageSize + 1;
  const last = Math.min(total, page * pageSize);
  return (
    <nav aria-label="Pages" className="mt-3 flex flex-wrap items-center justify-between gap-3 text-muted">
      <p aria-live="polite">
        {total === 0 ? 'No rows' : `Rows ${first}–${last} of ${total.toLocaleString('en')}${capped ? '+' : ''}`}
        {loading && <span className="ml-2 text-sm">(loading…)</span>}
      </p>
      <div className="flex items-center gap-2">
        <label className="flex items-center gap-2 text-sm">
          Rows per page
          <select value={pageSize} onChange={(e) => onPageSize(Number(e.target.value))} className="rounded-md border border-line bg-raised px-2 py-1 text-fg">
            {[...new Set([...PAGE_SIZES, pageSize])].sort((a, b) => a - b).map((s) => (
              <option key={s} value={s}>
                {s}
              </option>
            ))}
          </select>
        </label>
        <Button size="sm" onClick={() => onPage(page - 1)} disabled={page <= 1 || loading}>
          Previous
        </Button>
        <span className="text-sm">
          Page {page} of {pages}
        </span>
        <Button size="sm" onClick={() => onPage(page + 1)} disabled={page >= pages || loading}>
          Next
        </Button>
      </div>
    </nav>
  );
}
