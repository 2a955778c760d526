import { useState, type FormEvent } from 'react';
import { Button } from '../../../components/ui/button';
import { errorText } from '../../../components/ui/error-notice';
import { SelectField, TextField } from '../../../components/ui/field';
import { ApiError } from '../../../lib/api-error';
import { useCreateUser } from '../api/create-user';
import { CreateUserSchema, ROLE_LABELS } from '../types';

type Errors = Partial<Record<'email' | 'name' | 'role' | 'password' | 'form', string>>;
const roleOptions = Object.entries(ROLE_LABELS).map(([value, label]) => ({ value, label }));

export function CreateUserForm() {
  const create = useCreateUser();
  const [errors, setErrors] = useState<Errors>({});
  const [done, setDone] = useState<string | null>(null);

  function submit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const formEl = e.currentTarget;
    const f = new FormData(formEl);
    const parsed = CreateUserSchema.safeParse({
      email: String(f.get('email') ?? '').trim(),
      name: String(f.get('name') ?? ''),
      role: String(f.get('role') ?? ''),
      password: String(f.get('password') ?? ''),
    });
    setDone(null);
    if (!parsed.success) {
      const next: Errors = {};
      for (const i of parsed.error.issues) next[i.path[0] as keyof Errors] ??= i.message;
      setErrors(next);
      return;
    }
    setErrors({});
    create.mutate(parsed.data, {
      onSuccess: (user) => {
        formEl.reset();
        setDone(`Created ${user.email}. Give them the initial password by a safe route.`);
      },
      onError: (err) => {
        if (err instanceof ApiError && err.code === 'conflict') setErrors({ email: 'An account with this e-mail already exists.' });
        else if (err instanceof ApiError && err.code === 'validation_error') setErrors({ ...err.fieldErrors(), form: err.message });
        else setErrors({ form: errorText(err) });
      },
    });
  }

  return (
    <form onSubmit={submit} noValidate className="grid gap-4 sm:grid-cols-2">
      <TextField label="E-mail" name="email" type="email" autoComplete="off" error={errors.email} />
      <TextField label="Name" name="name" autoComplete="off" error={errors.name} />
      <SelectField label="Role" name="role" defaultValue="monitor" options={roleOptions} error={errors.role} />
      <TextField
        label="Initial password"
        name="password"
        type="password"
        autoComplete="new-password"
        hint="At least 10 characters."
        error={errors.password}
      />
      <div className="flex flex-wrap items-center gap-4 sm:col-span-2">
        <Button type="submit" variant="primary" disabled={create.isPending}>
          {create.isPending ? 'Creating…' : 'Create user'}
        </Button>
        {errors.form && <p role="alert" className="font-medium text-danger">{errors.form}</p>}
        {done && <p role="status" className="text-state-safe">{done}</p>}
      </div>
    </form>
  );
}
