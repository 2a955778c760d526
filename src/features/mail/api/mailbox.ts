import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { api } from '../../../lib/api-client';
import { parseResponse } from '../../../lib/parse-response';

export const MailSchema = z.object({ id: z.number(), receivedAt: z.string(), from: z.string().nullable(), to: z.array(z.string()), subject: z.string(), text: z.string() });
export type Mail = z.infer<typeof MailSchema>;
const StatusSchema = z.object({ transport: z.enum(['fake', 'smtp']).nullable(), fakePort: z.number().nullable() });
const key = ['mail', 'mailbox'] as const;

export const useMailbox = () =>
  useQuery({ queryKey: key, queryFn: async () => parseResponse(z.array(MailSchema), await api.get('/api/mail/mailbox'), 'mailbox'), refetchInterval: 10_000 });
export const useMailStatus = () =>
  useQuery({ queryKey: ['mail', 'status'], queryFn: async () => parseResponse(StatusSchema, await api.get('/api/mail/status'), 'mail status') });

export function useSendDigest() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: async () => parseResponse(z.object({ recipients: z.array(z.string()), subject: z.string() }).nullable(), await api.post('/api/mail/digest'), 'digest'),
    onSuccess: () => qc.invalidateQueries({ queryKey: key }),
  });
}
