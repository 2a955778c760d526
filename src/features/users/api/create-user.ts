import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { parseResponse } from '../../../lib/parse-response';
import { UserSchema, type CreateUserInput } from '../types';
import { usersQueryKey } from './get-users';

export async function createUser(input: CreateUserInput) {
  return parseResponse(UserSchema, await api.post('/api/users', input), 'new user');
}

export function useCreateUser() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: createUser, onSuccess: () => qc.invalidateQueries({ queryKey: usersQueryKey }) });
}
