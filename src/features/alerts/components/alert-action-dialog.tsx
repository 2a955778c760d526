import { useState, type FormEvent } from 'react';
import type { AlertView } from '../../../../shared/realtime/envelope';
import { Button } from '../../../components/ui/button';
import { Dialog } from '../../../components/ui/dialog';
import { errorText } from '../../../components/ui/error-notice';
import { TextField } from '../../../components/ui/field';
import { useAlertAction, type AlertAction } from '../api/alert-actions';
import { KIND_LABELS } from '../lib/alert-words';

export interface PendingAction {
  alert: AlertView;
  action: AlertAction;
}

/** Acknowledge or resolve one alert, with an optional comment. */
export function AlertActionDialog({ pending, onClose }: { pending: PendingAction | null; onClose: () => void }) {
  const act = useAlertAction();
  const [comment, setComment] = useState('');
  const close = () => {
    setComment('');
    act.reset();
    onClose();
  };
  const submit = (e: FormEvent) => {
    e.preventDefault();
    if (pending) act.mutate({ id: pending.alert.id, action: pending.action, comment }, { onSuccess: close });
  };
  const verb = pending?.action === 'resolve' ? 'Resolve' : 'Acknowledge';
  return (
    <Dialog open={pending !== null} onClose={close} title={pending ? `${verb} alert on ${pending.alert.unitId}` : verb}>
      {pending && (
        <form onSubmit={submit} className="flex flex-col gap-4">
          <p className="text-muted">
            {KIND_LABELS[pending.alert.kind]} · {pending.alert.depot}
          </p>
          <TextField
            label="Comment (optional)"
            name="comment"
            value={comment}
            maxLength={1000}
            onChange={(e) => setComment(e.target.value)}
            hint={pending.action === 'resolve' ? 'For example what was done: purge rerun, lines inspected.' : 'For example who is on it.'}
          />
          {act.isError && (
            <p role="alert" className="font-medium text-danger">
              {errorText(act.error)}
            </p>
          )}
          <div className="flex justify-end gap-2">
            <Button onClick={close}>Cancel</Button>
            <Button type="submit" variant="primary" disabled={act.isPending}>
              {act.isPending ? 'Saving…' : verb}
            </Button>
          </div>
        </form>
      )}
    </Dialog>
  );
}
