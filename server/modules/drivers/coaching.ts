// A driver's coaching view: interruption rate, the trend by ISO week, and the latest key-offs.
import type { Sequelize } from 'sequelize';
import { isoWeekLabel, isoWeekStart } from '../../../shared/api/reports';
import type { Coaching } from '../../../shared/api/drivers';
import { figures, presentFigures, type FigureRecord } from '../reports/figures';
import { pageOfEpisodes } from '../history/episodes';
import { presentHistoryEpisode } from '../history/presenter';
import { getDriver } from './service';
import { presentDriver } from './presenter';

const WEEK = 7 * 86_400_000;
const EMPTY: FigureRecord = { key_offs: '0', interrupted: '0', median_s: null, freeze_exposures: '0', faults_explained: '0' };

export async function coaching(db: Sequelize, driverId: number, weeks: number, now = Date.now()): Promise<Coaching> {
  const driver = await getDriver(db, driverId);
  const end = isoWeekStart(isoWeekLabel(now))! + WEEK;
  const from = end - weeks * WEEK;
  const span = { from, to: end, driverId };
  const [total, byWeek, last] = await Promise.all([
    figures(db, 'total', span),
    figures(db, 'week', span),
    pageOfEpisodes(db, { driverId, sort: 'keyOffAt', dir: 'desc', page: 1, pageSize: 20 }, 20, 0),
  ]);
  const weekMap = new Map(byWeek.map((r) => [new Date(r.week_start as Date).getTime(), r]));
  return {
    driver: presentDriver(driver),
    totals: presentFigures(total[0] ?? EMPTY),
    trend: Array.from({ length: weeks }, (_, i) => {
      const ws = from + i * WEEK;
      return { week: isoWeekLabel(ws), weekStart: new Date(ws).toISOString(), ...presentFigures(weekMap.get(ws) ?? EMPTY) };
    }),
    lastEvents: last.map(presentHistoryEpisode),
  };
}
