import { useState, type FormEvent } from 'react';
import { Button } from '../../../components/ui/button';
import { errorText } from '../../../components/ui/error-notice';
import { SelectField, TextField } from '../../../components/ui/field';
import type { WorkOrderView } from '../../../../shared/api/work-orders';
import { useActiveAlerts } from '../api/get-active-alerts';
import { useTechnicians } from '../api/get-technicians';
import { useCreateWorkOrder } from '../api/work-order-mutations';
import { ALERT_KIND_WORDS } from '../lib/words';

type Kind = 'alert' | 'episode' | 'fault';

/** Opens a work order from an alert (chosen from the active ones), an episode or a fault (by number). */
export function OpenWorkOrderForm({ initialAlertId, onOpened }: { initialAlertId?: number; onOpened: (w: WorkOrderView) => void }) {
  const alerts = useActiveAlerts();
  const technicians = useTechnicians();
  const create = useCreateWorkOrder();
  const [kind, setKind] = useState<Kind>('alert');
  const [alertId, setAlertId] = useState(initialAlertId ? String(initialAlertId) : '');
  const [error, setError] = useState<string | null>(null);

  function submit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const f = new FormData(e.currentTarget);
    const id = Number(kind === 'alert' ? alertId : f.get('sourceId'));
    if (!Number.isInteger(id) || id <= 0) return setError(kind === 'alert' ? 'Choose an alert.' : `Enter the ${kind} number.`);
    const assignee = Number(f.get('assigneeId'));
    const title = String(f.get('title') ?? '').trim();
    setError(null);
    create.mutate(
      { source: { kind, id }, ...(assignee ? { assigneeId: assignee } : {}), ...(title ? { title } : {}) },
      { onSuccess: onOpened, onError: (err) => setError(errorText(err)) },
    );
  }

  const alertOptions = (alerts.data ?? []).map((a) => ({ value: String(a.id), label: `#${a.id} · ${a.unitId} · ${ALERT_KIND_WORDS[a.kind] ?? a.kind} · ${a.depot}` }));
  return (
    <form onSubmit={submit} noValidate className="grid gap-4 md:grid-cols-2">
      <SelectField label="Opened from" name="kind" value={kind} onChange={(e) => setKind(e.target.value as Kind)}
        options={[{ value: 'alert', label: 'An alert' }, { value: 'episode', label: 'A purge episode' }, { value: 'fault', label: 'A fault' }]} />
      {kind === 'alert' ? (
        <SelectField label="Alert" name="alertId" value={alertId} onChange={(e) => setAlertId(e.target.value)}
          options={[{ value: '', label: alerts.isPending ? 'Loading alerts…' : 'Choose an active alert…' }, ...alertOptions]} />
      ) : (
        <TextField label={kind === 'episode' ? 'Episode number' : 'Fault number'} name="sourceId" inputMode="numeric" />
      )}
      <SelectField label="Technician" name="assigneeId"
        options={[{ value: '', label: 'Assign later' }, ...(technicians.data ?? []).map((t) => ({ value: String(t.id), label: `${t.name} (${t.email})` }))]} />
      <TextField label="Title (optional)" name="title" maxLength={200} hint="Left empty, it says what the order was opened from." />
      <div className="flex items-center gap-4 md:col-span-2">
        <Button type="submit" variant="primary" disabled={create.isPending}>{create.isPending ? 'Opening…' : 'Open work order'}</Button>
        {error && <p role="alert" className="font-medium text-danger">{error}</p>}
      </div>
    </form>
  );
}
