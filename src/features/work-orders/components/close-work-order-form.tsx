import { useState, type FormEvent } from 'react';
import { Button } from '../../../components/ui/button';
import { errorText } from '../../../components/ui/error-notice';
import { SelectField, TextField } from '../../../components/ui/field';
import { WORK_ORDER_OUTCOMES, type WorkOrderView } from '../../../../shared/api/work-orders';
import { useCloseWorkOrder } from '../api/work-order-mutations';
import { OUTCOME_WORDS } from '../lib/words';

export function CloseWorkOrderForm({ order }: { order: WorkOrderView }) {
  const close = useCloseWorkOrder(order.id);
  const [error, setError] = useState<string | null>(null);
  // Before anything is recorded, the order can only be cancelled.
  const outcomes = order.status === 'open' ? (['cancelled'] as const) : WORK_ORDER_OUTCOMES;

  function submit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const f = new FormData(e.currentTarget);
    const outcome = f.get('outcome') as WorkOrderView['outcome'];
    if (!outcome) return setError('Choose an outcome.');
    setError(null);
    close.mutate({ outcome, note: String(f.get('note') ?? '').trim() || undefined }, { onError: (err) => setError(errorText(err)) });
  }

  return (
    <form onSubmit={submit} noValidate className="grid gap-3 sm:grid-cols-[16rem_1fr_auto] sm:items-end">
      <SelectField label="Outcome" name="outcome" options={[{ value: '', label: 'Choose…' }, ...outcomes.map((o) => ({ value: o, label: OUTCOME_WORDS[o] }))]} error={error ?? undefined} />
      <TextField label="Closing note" name="note" maxLength={2000} />
      <Button type="submit" variant="primary" disabled={close.isPending}>Close work order</Button>
    </form>
  );
}
