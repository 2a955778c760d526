import { useState, type FormEvent } from 'react';
import { Button } from '../../../components/ui/button';
import { ErrorNotice } from '../../../components/ui/error-notice';
import { SelectField, TextField } from '../../../components/ui/field';
import { ApiError } from '../../../lib/api-error';
import type { Driver } from '../../../../shared/api/drivers';
import { useCreateAssignment } from '../api/assignments';

// <input type="datetime-local"> gives a local wall time; it is sent as the instant it names here.
const toIso = (local: string) => (local ? new Date(local).toISOString() : null);

export function AssignmentForm({ drivers, unitIds }: { drivers: Driver[]; unitIds: string[] }) {
  const create = useCreateAssignment();
  const [form, setForm] = useState({ driverId: '', unitId: '', from: '', to: '' });
  const fields = create.error instanceof ApiError ? create.error.fieldErrors() : {};
  const submit = (e: FormEvent) => {
    e.preventDefault();
    create.mutate({ driverId: Number(form.driverId), unitId: form.unitId, from: toIso(form.from) ?? '', to: toIso(form.to) }, { onSuccess: () => setForm({ ...form, from: '', to: '' }) });
  };
  return (
    <form onSubmit={submit} className="flex flex-col gap-3" aria-label="Add an assignment">
      <div className="flex flex-wrap items-end gap-3">
        <SelectField label="Driver" value={form.driverId} onChange={(e) => setForm({ ...form, driverId: e.target.value })} required error={fields.driverId}
          options={[{ value: '', label: 'Choose…' }, ...drivers.map((d) => ({ value: String(d.id), label: `${d.name} (${d.code})` }))]} className="w-64" />
        <SelectField label="Unit" value={form.unitId} onChange={(e) => setForm({ ...form, unitId: e.target.value })} required error={fields.unitId}
          options={[{ value: '', label: 'Choose…' }, ...unitIds.map((u) => ({ value: u, label: u }))]} className="w-44" />
        <TextField label="From (your time)" type="datetime-local" value={form.from} onChange={(e) => setForm({ ...form, from: e.target.value })} required error={fields.from} />
        <TextField label="To (empty = still driving)" type="datetime-local" value={form.to} onChange={(e) => setForm({ ...form, to: e.target.value })} error={fields.to} />
        <Button type="submit" variant="primary" disabled={create.isPending}>Add assignment</Button>
      </div>
      {create.isError && !Object.keys(fields).length && <ErrorNotice title="Not added" error={create.error} />}
    </form>
  );
}
