import { z } from 'zod';
import { RoleSchema } from '../../lib/session-store';

export const UserSchema = z.object({
  id: z.union([z.string(), z.number()]),
  email: z.string(),
  name: z.string(),
  role: RoleSchema,
  active: z.boolean(),
  createdAt: z.string(),
  lastLoginAt: z.string().nullable(),
});
export type User = z.infer<typeof UserSchema>;

export const ROLE_LABELS = {
  admin: 'Admin',
  monitor: 'Monitor',
  planner: 'Planner',
  technician: 'Technician',
} as const;

export const CreateUserSchema = z.object({
  email: z.email('Enter an e-mail address.'),
  name: z.string().trim().min(1, 'Enter a name.').max(120),
  role: RoleSchema,
  password: z.string().min(10, 'At least 10 characters.').max(200),
});
export type CreateUserInput = z.infer<typeof CreateUserSchema>;
