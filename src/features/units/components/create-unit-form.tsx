import { useState, type FormEvent } from 'react';
import { Button } from '../../../components/ui/button';
import { errorText } from '../../../components/ui/error-notice';
import { TextField } from '../../../components/ui/field';
import { ApiError } from '../../../lib/api-error';
import { issuesByField, readText } from '../../../lib/form-data';
import { useCreateUnit } from '../api/create-unit';
import { CreateUnitSchema } from '../api/unit-input';
import { readUnitProfile } from '../lib/read-unit-form';
import { UnitProfileFields } from './unit-profile-fields';

export function CreateUnitForm() {
  const create = useCreateUnit();
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [done, setDone] = useState<string | null>(null);

  function submit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const formEl = e.currentTarget;
    const f = new FormData(formEl);
    const parsed = CreateUnitSchema.safeParse({ id: readText(f, 'id'), ...readUnitProfile(f) });
    setDone(null);
    if (!parsed.success) return setErrors(issuesByField(parsed.error.issues));
    setErrors({});
    create.mutate(parsed.data, {
      onSuccess: (unit) => {
        formEl.reset();
        setDone(`Unit ${unit.id} created. Provision a gateway for it on the Gateways page.`);
      },
      onError: (err) => {
        if (err instanceof ApiError && err.status === 409) setErrors({ id: 'A unit with this id already exists.' });
        else if (err instanceof ApiError && err.code === 'validation_error') setErrors({ ...err.fieldErrors(), form: err.message });
        else setErrors({ form: errorText(err) });
      },
    });
  }

  return (
    <form onSubmit={submit} noValidate className="grid gap-4 sm:grid-cols-2 xl:grid-cols-4">
      <TextField label="Unit id" name="id" autoComplete="off" hint="As painted on the unit, e.g. T-0412." error={errors.id} />
      <UnitProfileFields errors={errors} />
      <div className="flex flex-wrap items-center gap-4 sm:col-span-2 xl:col-span-4">
        <Button type="submit" variant="primary" disabled={create.isPending}>
          {create.isPending ? 'Creating…' : 'Create unit'}
        </Button>
        {errors.form && <p role="alert" className="font-medium text-danger">{errors.form}</p>}
        {done && <p role="status" className="text-state-safe">{done}</p>}
      </div>
    </form>
  );
}
