import { useState, type FormEvent } from 'react';
import { Button } from '../../../components/ui/button';
import { ErrorNotice } from '../../../components/ui/error-notice';
import { TextField } from '../../../components/ui/field';
import { ApiError } from '../../../lib/api-error';
import { useCreateDriver } from '../api/assignments';

export function DriverForm() {
  const create = useCreateDriver();
  const [form, setForm] = useState({ code: '', name: '', depot: '' });
  const fields = create.error instanceof ApiError ? create.error.fieldErrors() : {};
  const submit = (e: FormEvent) => {
    e.preventDefault();
    create.mutate({ code: form.code.trim(), name: form.name.trim(), depot: form.depot.trim() || null }, { onSuccess: () => setForm({ code: '', name: '', depot: '' }) });
  };
  return (
    <form onSubmit={submit} className="flex flex-wrap items-end gap-3" aria-label="Add a driver">
      <TextField label="Code" value={form.code} onChange={(e) => setForm({ ...form, code: e.target.value })} error={fields.code} required className="w-36" />
      <TextField label="Name" value={form.name} onChange={(e) => setForm({ ...form, name: e.target.value })} error={fields.name} required className="w-64" />
      <TextField label="Depot (optional)" value={form.depot} onChange={(e) => setForm({ ...form, depot: e.target.value })} className="w-48" />
      <Button type="submit" variant="primary" disabled={create.isPending}>Add driver</Button>
      {create.isError && !Object.keys(fields).length && <ErrorNotice error={create.error} />}
    </form>
  );
}
