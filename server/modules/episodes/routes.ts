import { Router } from 'express';
import { requirePermission } from '../../lib/middleware';
import { EpisodeQuerySchema } from '../../../shared/api/history';
import { listEpisodes } from './service';
import { presentEpisode } from './presenter';

export function episodeRoutes() {
  const r = Router();
  r.get('/', requirePermission('episodes.read'), async (req, res) => {
    res.json((await listEpisodes(EpisodeQuerySchema.parse(req.query))).map(presentEpisode));
  });
  return r;
}
