import bcrypt from 'bcryptjs';
import { UniqueConstraintError } from 'sequelize';
import { User, type Role } from '../../db/models/user';
import { conflict, notFound } from '../../lib/errors';
import type { AuthUser } from '../../lib/middleware';
import { recordAudit } from '../audit/service';

export const hashPassword = (password: string) => bcrypt.hash(password, 10);

export async function listUsers() {
  return User.findAll({ order: [['email', 'ASC']] });
}

export async function createUser(actor: AuthUser | null, input: { email: string; name: string; role: Role; password: string }) {
  try {
    const user = await User.create({ email: input.email.toLowerCase(), name: input.name, role: input.role, passwordHash: await hashPassword(input.password) });
    await recordAudit(actor, 'user.create', `user:${user.email}`, { role: user.role });
    return user;
  } catch (err) {
    if (err instanceof UniqueConstraintError) throw conflict(`A user with e-mail ${input.email} already exists`);
    throw err;
  }
}

export async function updateUser(actor: AuthUser, id: number, input: { name?: string; role?: Role; active?: boolean; password?: string }) {
  const user = await User.findByPk(id);
  if (!user) throw notFound('User');
  if (user.id === actor.id && (input.active === false || (input.role && input.role !== 'admin'))) {
    throw conflict('You cannot deactivate or demote yourself; ask another admin');
  }
  const changes: Partial<Pick<User, 'name' | 'role' | 'active' | 'passwordHash'>> = {};
  if (input.name !== undefined) changes.name = input.name;
  if (input.role !== undefined) changes.role = input.role;
  if (input.active !== undefined) changes.active = input.active;
  if (input.password !== undefined) changes.passwordHash = await hashPassword(input.password);
  await user.update(changes);
  const details: Record<string, unknown> = { ...input };
  if (details.password) details.password = '(changed)';
  await recordAudit(actor, 'user.update', `user:${user.email}`, details);
  return user;
}

/** The first admin, from ADMIN_EMAIL / ADMIN_PASSWORD, when there is no user at all. */
export async function ensureFirstAdmin(email: string, password: string): Promise<boolean> {
  if ((await User.count()) > 0) return false;
  await createUser(null, { email, name: 'Administrator', role: 'admin', password });
  return true;
}
