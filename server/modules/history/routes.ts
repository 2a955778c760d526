// GET /api/history/episodes|faults (paged) and …/export.csv (every filtered row, streamed).
import { Router } from 'express';
import type { AppContext } from '../../lib/context';
import { requirePermission } from '../../lib/middleware';
import { logger } from '../../lib/logger';
import { HistoryEpisodeQuerySchema, HistoryFaultQuerySchema } from '../../../shared/api/history-query';
import { countEpisodes, pageOfEpisodes } from './episodes';
import { countFaults, pageOfFaults } from './faults';
import { EPISODE_CSV, FAULT_CSV, presentHistoryEpisode, presentHistoryFault } from './presenter';
import { streamCsv } from './csv-stream';
import { COUNT_CAP } from './sql-builder';

const log = logger('history');
const stamp = () => new Date().toISOString().slice(0, 19).replace(/[-:]/g, '').replace('T', '-');

/** A page of rows with the pager's total, counted up to COUNT_CAP ("10,000+" past it). */
const pageBody = <R>(rows: R[], total: number, q: { page: number; pageSize: number }) => ({
  rows, total: Math.min(total, COUNT_CAP), totalCapped: total > COUNT_CAP, page: q.page, pageSize: q.pageSize,
});

export function historyRoutes(ctx: AppContext) {
  const r = Router();
  const db = ctx.sequelize;

  r.get('/episodes', requirePermission('episodes.read'), async (req, res) => {
    const q = HistoryEpisodeQuerySchema.parse(req.query);
    const [total, rows] = await Promise.all([countEpisodes(db, q), pageOfEpisodes(db, q, q.pageSize, (q.page - 1) * q.pageSize)]);
    res.json(pageBody(rows.map(presentHistoryEpisode), total, q));
  });

  r.get('/episodes/export.csv', requirePermission('episodes.read'), async (req, res) => {
    const q = HistoryEpisodeQuerySchema.parse(req.query);
    await streamCsv(res, {
      sequelize: db, log, filename: `episodes-${stamp()}.csv`, columns: EPISODE_CSV,
      page: async (limit, offset, tx) => (await pageOfEpisodes(db, q, limit, offset, tx)).map(presentHistoryEpisode),
    });
  });

  r.get('/faults', requirePermission('faults.read'), async (req, res) => {
    const q = HistoryFaultQuerySchema.parse(req.query);
    const [total, rows] = await Promise.all([countFaults(db, q), pageOfFaults(db, q, q.pageSize, (q.page - 1) * q.pageSize)]);
    res.json(pageBody(rows.map(presentHistoryFault), total, q));
  });

  r.get('/faults/export.csv', requirePermission('faults.read'), async (req, res) => {
    const q = HistoryFaultQuerySchema.parse(req.query);
    await streamCsv(res, {
      sequelize: db, log, filename: `faults-${stamp()}.csv`, columns: FAULT_CSV,
      page: async (limit, offset, tx) => (await pageOfFaults(db, q, limit, offset, tx)).map(presentHistoryFault),
    });
  });
  return r;
}
