import { Op, type Transaction } from 'sequelize';
import { AuditEntry } from '../../db/models/audit-entry';
import { User } from '../../db/models/user';
import type { AuthUser } from '../../lib/middleware';

export async function recordAudit(
  actor: AuthUser | null,
  action: string,
  target: string,
  details: Record<string, unknown> | null = null,
  transaction?: Transaction,
) {
  await AuditEntry.create({ at: new Date(), actorId: actor?.id ?? null, action, target, details }, { transaction });
}

export async function listAudit(opts: { limit: number; before?: number }) {
  return AuditEntry.findAll({
    where: opts.before ? { id: { [Op.lt]: opts.before } } : {},
    order: [['id', 'DESC']],
    limit: opts.limit,
    include: [{ model: User, as: 'actor', attributes: ['id', 'email'] }],
  });
}
