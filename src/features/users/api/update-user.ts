import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { parseResponse } from '../../../lib/parse-response';
import type { Role } from '../../../lib/session-store';
import { UserSchema, type User } from '../types';
import { usersQueryKey } from './get-users';

export interface UserChange {
  id: User['id'];
  change: { name?: string; role?: Role; active?: boolean; password?: string };
}

export async function updateUser({ id, change }: UserChange) {
  return parseResponse(UserSchema, await api.patch(`/api/users/${encodeURIComponent(String(id))}`, change), 'updated user');
}

/** The server refuses (409) an admin deactivating or demoting themselves; the row shows why. */
export function useUpdateUser() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: updateUser, onSettled: () => qc.invalidateQueries({ queryKey: usersQueryKey }) });
}
