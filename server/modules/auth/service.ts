import bcrypt from 'bcryptjs';
import jwt from 'jsonwebtoken';
import { User } from '../../db/models/user';
import { AppError } from '../../lib/errors';
import type { AuthUser, TokenClaims } from '../../lib/middleware';

export const presentSessionUser = (u: User): AuthUser => ({ id: u.id, email: u.email, name: u.name, role: u.role });

// A hash to compare against when the e-mail is unknown, so that both paths take the same time.
const DUMMY_HASH = bcrypt.hashSync('not-a-real-password', 10);

export async function login(email: string, password: string, secret: string, ttlSeconds: number) {
  const user = await User.findOne({ where: { email: email.toLowerCase() } });
  const ok = await bcrypt.compare(password, user?.passwordHash ?? DUMMY_HASH);
  if (!user || !ok || !user.active) throw new AppError('invalid_credentials', 401, 'Wrong e-mail or password');
  await user.update({ lastLoginAt: new Date() });
  const claims: TokenClaims = { sub: String(user.id), email: user.email, name: user.name, role: user.role };
  const token = jwt.sign(claims, secret, { algorithm: 'HS256', expiresIn: ttlSeconds });
  return { token, user: presentSessionUser(user) };
}

export async function loadActiveUser(id: number): Promise<AuthUser | null> {
  const user = await User.findByPk(id);
  return user && user.active ? presentSessionUser(user) : null;
}
