import { useMutation } from '@tanstack/react-query';
import { z } from 'zod';
import { api } from '../../../lib/api-client';
import { parseResponse } from '../../../lib/parse-response';
import { session } from '../../../lib/session';
import { SessionUserSchema } from '../../../lib/session-store';

export const LoginInputSchema = z.object({
  email: z.email('Enter an e-mail address.'),
  password: z.string().min(1, 'Enter your password.'),
});
export type LoginInput = z.infer<typeof LoginInputSchema>;

const LoginResponseSchema = z.object({ token: z.string().min(1), user: SessionUserSchema });

export async function login(input: LoginInput) {
  const data = await api.post('/api/auth/login', input);
  const { token, user } = parseResponse(LoginResponseSchema, data, 'sign-in answer');
  return session.set(token, user);
}

export function useLogin() {
  return useMutation({ mutationFn: login });
}
