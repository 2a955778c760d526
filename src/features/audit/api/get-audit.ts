import { infiniteQueryOptions, useInfiniteQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { api } from '../../../lib/api-client';
import { parseResponse } from '../../../lib/parse-response';
import { AuditEntrySchema, type AuditEntry } from '../types';

export const AUDIT_PAGE_SIZE = 100;

export async function getAudit({ before, limit = AUDIT_PAGE_SIZE }: { before?: number; limit?: number }) {
  return parseResponse(z.array(AuditEntrySchema), await api.get('/api/audit', { query: { limit, before } }), 'audit log');
}

/** Newest first; each older page starts below the smallest id seen (`before` is an entry id). */
export const auditQueryOptions = () =>
  infiniteQueryOptions({
    queryKey: ['audit'],
    queryFn: ({ pageParam }) => getAudit({ before: pageParam }),
    initialPageParam: undefined as number | undefined,
    getNextPageParam: (last: AuditEntry[]) => (last.length < AUDIT_PAGE_SIZE ? undefined : last[last.length - 1].id),
  });

export function useAudit() {
  return useInfiniteQuery(auditQueryOptions());
}
