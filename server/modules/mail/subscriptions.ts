// Who gets a depot's alert mails: each user may subscribe themselves; admins anyone.
import { QueryTypes, type Sequelize } from 'sequelize';
import { forbidden, notFound } from '../../lib/errors';
import type { AuthUser } from '../../lib/middleware';
import { recordAudit } from '../audit/service';

export async function listSubscriptions(sequelize: Sequelize, actor: AuthUser) {
  const rows = await sequelize.query<{ user_id: number; email: string; name: string; depot: string }>(
    `SELECT s.user_id, u.email, u.name, s.depot FROM depot_subscriptions s JOIN users u ON u.id = s.user_id
     WHERE ($1::int IS NULL OR s.user_id = $1) ORDER BY s.depot, u.email`,
    { bind: [actor.role === 'admin' ? null : actor.id], type: QueryTypes.SELECT },
  );
  return rows.map((r) => ({ userId: r.user_id, email: r.email, name: r.name, depot: r.depot }));
}

function mayManage(actor: AuthUser, userId: number) {
  if (actor.role !== 'admin' && actor.id !== userId) throw forbidden('You may only change your own subscriptions');
}

export async function subscribe(sequelize: Sequelize, actor: AuthUser, userId: number, depot: string) {
  mayManage(actor, userId);
  const [user] = await sequelize.query<{ id: number }>('SELECT id FROM users WHERE id = $1', { bind: [userId], type: QueryTypes.SELECT });
  if (!user) throw notFound(`User ${userId}`);
  await sequelize.query('INSERT INTO depot_subscriptions (user_id, depot) VALUES ($1, $2) ON CONFLICT DO NOTHING', { bind: [userId, depot] });
  await recordAudit(actor, 'mail.subscribe', `user:${userId}`, { depot });
}

export async function unsubscribe(sequelize: Sequelize, actor: AuthUser, userId: number, depot: string) {
  mayManage(actor, userId);
  await sequelize.query('DELETE FROM depot_subscriptions WHERE user_id = $1 AND depot = $2', { bind: [userId, depot] });
  await recordAudit(actor, 'mail.unsubscribe', `user:${userId}`, { depot });
}

export async function subscribersOf(sequelize: Sequelize, depot: string): Promise<string[]> {
  const rows = await sequelize.query<{ email: string }>(
    `SELECT u.email FROM depot_subscriptions s JOIN users u ON u.id = s.user_id WHERE s.depot = $1 AND u.active ORDER BY u.email`,
    { bind: [depot], type: QueryTypes.SELECT },
  );
  return rows.map((r) => r.email);
}
