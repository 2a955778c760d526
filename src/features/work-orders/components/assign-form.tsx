import { useState } from 'react';
import { Button } from '../../../components/ui/button';
import { errorText } from '../../../components/ui/error-notice';
import { SelectField } from '../../../components/ui/field';
import type { WorkOrderView } from '../../../../shared/api/work-orders';
import { useTechnicians } from '../api/get-technicians';
import { useAssignWorkOrder } from '../api/work-order-mutations';

export function AssignForm({ order }: { order: WorkOrderView }) {
  const technicians = useTechnicians();
  const assign = useAssignWorkOrder(order.id);
  const [choice, setChoice] = useState(order.assignee ? String(order.assignee.id) : '');
  const [error, setError] = useState<string | null>(null);
  return (
    <div className="flex flex-wrap items-end gap-3">
      <SelectField label="Technician" value={choice} onChange={(e) => setChoice(e.target.value)} className="min-w-64"
        options={[{ value: '', label: 'Choose…' }, ...(technicians.data ?? []).map((t) => ({ value: String(t.id), label: `${t.name} (${t.email})` }))]} />
      <Button disabled={!choice || assign.isPending} onClick={() => assign.mutate(Number(choice), { onError: (err) => setError(errorText(err)) })}>Assign</Button>
      {error && <p role="alert" className="font-medium text-danger">{error}</p>}
    </div>
  );
}
