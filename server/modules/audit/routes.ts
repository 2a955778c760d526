import { Router } from 'express';
import { z } from 'zod';
import { requirePermission } from '../../lib/middleware';
import { listAudit } from './service';
import type { AuditEntry } from '../../db/models/audit-entry';

const Query = z.object({
  limit: z.coerce.number().int().min(1).max(500).default(100),
  before: z.coerce.number().int().positive().optional(),
});

export function presentAuditEntry(e: AuditEntry) {
  const actor = (e as AuditEntry & { actor?: { id: number; email: string } | null }).actor;
  return { id: Number(e.id), at: e.at.toISOString(), actor: actor ? { id: actor.id, email: actor.email } : null, action: e.action, target: e.target, details: e.details };
}

export function auditRoutes() {
  const r = Router();
  r.get('/', requirePermission('audit.read'), async (req, res) => {
    const q = Query.parse(req.query);
    res.json((await listAudit(q)).map(presentAuditEntry));
  });
  return r;
}
