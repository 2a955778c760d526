import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { api } from '../../../lib/api-client';
import { parseResponse } from '../../../lib/parse-response';
import { UserSchema } from '../types';

export const usersQueryKey = ['users'] as const;

export async function getUsers() {
  return parseResponse(z.array(UserSchema), await api.get('/api/users'), 'user list');
}

export const usersQueryOptions = () => queryOptions({ queryKey: usersQueryKey, queryFn: getUsers });

export function useUsers() {
  return useQuery(usersQueryOptions());
}
