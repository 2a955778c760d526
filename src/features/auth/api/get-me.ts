import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { api } from '../../../lib/api-client';
import { parseResponse } from '../../../lib/parse-response';
import { SessionUserSchema } from '../../../lib/session-store';

const MeSchema = z.object({ user: SessionUserSchema });

export async function getMe() {
  return parseResponse(MeSchema, await api.get('/api/auth/me'), 'account details').user;
}

export const meQueryOptions = () => queryOptions({ queryKey: ['auth', 'me'], queryFn: getMe, staleTime: 60_000 });

/** Confirms the stored token with the server; a rejected token ends the session (see api-client). */
export function useMe(enabled = true) {
  return useQuery({ ...meQueryOptions(), enabled });
}
