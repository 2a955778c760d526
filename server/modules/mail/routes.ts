import { Router } from 'express';
import { z } from 'zod';
import { requirePermission } from '../../lib/middleware';
import type { AppContext } from '../../lib/context';
import { getMail, listMailbox } from './mailbox';
import { listSubscriptions, subscribe, unsubscribe } from './subscriptions';
import type { MailService } from './start';

const Sub = z.object({ depot: z.string().trim().min(1).max(120), userId: z.coerce.number().int().positive().optional() }).strict();
const Limit = z.object({ limit: z.coerce.number().int().min(1).max(500).default(100) });
const Id = z.object({ id: z.coerce.number().int().positive() });

export function mailRoutes(ctx: AppContext, mail: () => MailService | null) {
  const r = Router();
  r.get('/subscriptions', requirePermission('mail.subscribe'), async (req, res) => {
    res.json(await listSubscriptions(ctx.sequelize, req.user!));
  });
  r.post('/subscriptions', requirePermission('mail.subscribe'), async (req, res) => {
    const s = Sub.parse(req.body);
    await subscribe(ctx.sequelize, req.user!, s.userId ?? req.user!.id, s.depot);
    res.status(201).json({ userId: s.userId ?? req.user!.id, depot: s.depot });
  });
  r.delete('/subscriptions', requirePermission('mail.subscribe'), async (req, res) => {
    const s = Sub.parse(req.query);
    await unsubscribe(ctx.sequelize, req.user!, s.userId ?? req.user!.id, s.depot);
    res.status(204).end();
  });
  r.get('/status', requirePermission('mail.admin'), (_req, res) => {
    const m = mail();
    res.json({ transport: m?.transport ?? null, fakePort: m?.fakePort ?? null });
  });
  r.get('/mailbox', requirePermission('mail.admin'), async (req, res) => {
    res.json(await listMailbox(ctx.sequelize, Limit.parse(req.query).limit));
  });
  r.get('/mailbox/:id', requirePermission('mail.admin'), async (req, res) => {
    res.json(await getMail(ctx.sequelize, Id.parse(req.params).id));
  });
  r.post('/digest', requirePermission('mail.admin'), async (_req, res) => {
    const m = mail();
    if (!m) throw new Error('mail is not started');
    res.json(await m.sendDigest(null));
  });
  return r;
}
