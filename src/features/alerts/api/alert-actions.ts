import { useMutation, useQueryClient } from '@tanstack/react-query';
import { AlertViewSchema } from '../../../../shared/realtime/envelope';
import { upsertAlert } from '../../../lib/alert-cache';
import { api } from '../../../lib/api-client';
import { dismissBannerAlert } from '../../../lib/live-feed';
import { parseResponse } from '../../../lib/parse-response';

export type AlertAction = 'acknowledge' | 'resolve';

export async function actOnAlert({ id, action, comment }: { id: number; action: AlertAction; comment?: string }) {
  const body = comment && comment.trim() ? { comment: comment.trim() } : {};
  return parseResponse(AlertViewSchema, await api.post(`/api/alerts/${id}/${action}`, body), `${action}d alert`);
}

/** Acknowledge or resolve (monitor and admin; the server checks the role). */
export function useAlertAction() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: actOnAlert,
    onSuccess: (alert) => {
      upsertAlert(qc, alert);
      if (alert.status !== 'open') dismissBannerAlert(alert.id);
    },
  });
}
