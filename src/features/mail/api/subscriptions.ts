import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { api } from '../../../lib/api-client';
import { parseResponse } from '../../../lib/parse-response';

export const SubscriptionSchema = z.object({ userId: z.number(), email: z.string(), name: z.string(), depot: z.string() });
export type Subscription = z.infer<typeof SubscriptionSchema>;
const key = ['mail', 'subscriptions'] as const;

export async function getSubscriptions() {
  return parseResponse(z.array(SubscriptionSchema), await api.get('/api/mail/subscriptions'), 'subscriptions');
}
export const useSubscriptions = () => useQuery({ queryKey: key, queryFn: getSubscriptions });

export function useSubscriptionChange() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: async (c: { depot: string; userId?: number; on: boolean }) => {
      const q = new URLSearchParams({ depot: c.depot, ...(c.userId ? { userId: String(c.userId) } : {}) });
      if (c.on) await api.post('/api/mail/subscriptions', { depot: c.depot, ...(c.userId ? { userId: c.userId } : {}) });
      else await api.delete(`/api/mail/subscriptions?${q}`);
    },
    onSuccess: () => qc.invalidateQueries({ queryKey: key }),
  });
}
