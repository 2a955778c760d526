import { Router } from 'express';
import { z } from 'zod';
import { requirePermission } from '../../lib/middleware';
import { ROLES, type User } from '../../db/models/user';
import { createUser, listUsers, updateUser } from './service';

const Password = z.string().min(10, 'must be at least 10 characters').max(200);
const CreateBody = z.object({ email: z.string().trim().email().max(254), name: z.string().trim().min(1).max(120), role: z.enum(ROLES), password: Password });
const UpdateBody = z
  .object({ name: z.string().trim().min(1).max(120).optional(), role: z.enum(ROLES).optional(), active: z.boolean().optional(), password: Password.optional() })
  .strict();
const IdParam = z.object({ id: z.coerce.number().int().positive() });

export const presentUser = (u: User) => ({
  id: u.id, email: u.email, name: u.name, role: u.role, active: u.active,
  createdAt: u.createdAt.toISOString(), lastLoginAt: u.lastLoginAt ? u.lastLoginAt.toISOString() : null,
});

export function userRoutes() {
  const r = Router();
  r.use(requirePermission('users.manage'));
  r.get('/', async (_req, res) => {
    res.json((await listUsers()).map(presentUser));
  });
  r.post('/', async (req, res) => {
    res.status(201).json(presentUser(await createUser(req.user!, CreateBody.parse(req.body))));
  });
  r.patch('/:id', async (req, res) => {
    const { id } = IdParam.parse(req.params);
    res.json(presentUser(await updateUser(req.user!, id, UpdateBody.parse(req.body))));
  });
  return r;
}
