// History filters live in the address, so a filtered view can be bookmarked and shared.
import { EPISODE_SORTS, FAULT_SORTS, MAX_PAGE_SIZE } from '../../../../shared/api/history-query';
import { OUTCOMES } from '../../../../shared/api/history';

export type HistoryView = 'episodes' | 'faults';

export interface HistoryFilters {
  view: HistoryView;
  depot: string;
  unitId: string;
  driverId: string;
  outcome: string;
  linked: string;
  /** yyyy-mm-dd, a UTC day; `to` is inclusive in the form and sent as the next midnight. */
  fromDay: string;
  toDay: string;
  sort: string;
  dir: 'asc' | 'desc';
  page: number;
  pageSize: number;
}

const pick = (v: string | null, allowed: readonly string[], fallback: string) => (v && allowed.includes(v) ? v : fallback);
export const PAGE_SIZES = [25, 50, 100, 200];
/** Any whole number the server accepts (1..500) may come in the address; the selector offers the usual ones. */
function readPageSize(v: string | null) {
  const n = Number(v);
  return Number.isInteger(n) && n >= 1 && n <= MAX_PAGE_SIZE ? n : 50;
}
const DAY = /^\d{4}-\d{2}-\d{2}$/;

export function readHistoryFilters(p: URLSearchParams): HistoryFilters {
  const view = p.get('view') === 'faults' ? 'faults' : 'episodes';
  const sorts = view === 'faults' ? FAULT_SORTS : EPISODE_SORTS;
  return {
    view,
    depot: p.get('depot') ?? '',
    unitId: p.get('unitId') ?? '',
    driverId: p.get('driverId') ?? '',
    outcome: pick(p.get('outcome'), OUTCOMES, ''),
    linked: pick(p.get('linked'), ['yes', 'no'], ''),
    fromDay: DAY.test(p.get('from') ?? '') ? p.get('from')! : '',
    toDay: DAY.test(p.get('to') ?? '') ? p.get('to')! : '',
    sort: pick(p.get('sort'), sorts, sorts[0]),
    dir: p.get('dir') === 'asc' ? 'asc' : 'desc',
    page: Math.max(1, Number.parseInt(p.get('page') ?? '1', 10) || 1),
    pageSize: readPageSize(p.get('pageSize')),
  };
}

export function writeHistoryFilters(f: HistoryFilters): URLSearchParams {
  const p = new URLSearchParams();
  if (f.view !== 'episodes') p.set('view', f.view);
  const set = (k: string, v: string) => v && p.set(k, v);
  set('depot', f.depot);
  set('unitId', f.unitId);
  set('driverId', f.driverId);
  if (f.view === 'episodes') set('outcome', f.outcome);
  else set('linked', f.linked);
  set('from', f.fromDay);
  set('to', f.toDay);
  p.set('sort', f.sort);
  p.set('dir', f.dir);
  if (f.page > 1) p.set('page', String(f.page));
  if (f.pageSize !== 50) p.set('pageSize', String(f.pageSize));
  return p;
}

const nextDay = (day: string) => new Date(Date.parse(`${day}T00:00:00Z`) + 86_400_000).toISOString();

/** The server's query for these filters (without paging when `paged` is false, as the CSV export takes it). */
export function historyQuery(f: HistoryFilters, paged = true): Record<string, string | number> {
  const q: Record<string, string | number> = { sort: f.sort, dir: f.dir };
  if (f.depot) q.depot = f.depot;
  if (f.unitId) q.unitId = f.unitId;
  if (f.driverId) q.driverId = f.driverId;
  if (f.view === 'episodes' && f.outcome) q.outcome = f.outcome;
  if (f.view === 'faults' && f.linked) q.linked = f.linked;
  if (f.fromDay) q.from = `${f.fromDay}T00:00:00.000Z`;
  if (f.toDay) q.to = nextDay(f.toDay);
  if (paged) {
    q.page = f.page;
    q.pageSize = f.pageSize;
  }
  return q;
}
