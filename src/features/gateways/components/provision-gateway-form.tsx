import { useState, type FormEvent } from 'react';
import { Button } from '../../../components/ui/button';
import { errorText } from '../../../components/ui/error-notice';
import { SelectField, TextField } from '../../../components/ui/field';
import { ApiError } from '../../../lib/api-error';
import { issuesByField, readText } from '../../../lib/form-data';
import { useProvisionGateway } from '../api/provision-gateway';
import { ProvisionGatewaySchema, type ProvisionedGateway } from '../types';

export interface UnitOption {
  id: string;
  name: string;
  gatewayId: string | null;
}

export function ProvisionGatewayForm({ units, onProvisioned }: { units: UnitOption[]; onProvisioned: (g: ProvisionedGateway) => void }) {
  const provision = useProvisionGateway();
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [unitId, setUnitId] = useState('');
  const current = units.find((u) => u.id === unitId)?.gatewayId ?? null;

  function submit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const formEl = e.currentTarget;
    const f = new FormData(formEl);
    const parsed = ProvisionGatewaySchema.safeParse({ gatewayId: readText(f, 'gatewayId'), unitId: readText(f, 'unitId') });
    if (!parsed.success) return setErrors(issuesByField(parsed.error.issues));
    setErrors({});
    provision.mutate(parsed.data, {
      onSuccess: (g) => {
        formEl.reset();
        setUnitId('');
        onProvisioned(g);
      },
      onError: (err) => {
        if (err instanceof ApiError && err.status === 409) setErrors({ gatewayId: 'This gateway id is already in use.' });
        else if (err instanceof ApiError && err.status === 404) setErrors({ unitId: 'This unit no longer exists.' });
        else setErrors({ form: errorText(err) });
      },
    });
  }

  return (
    <form onSubmit={submit} noValidate className="grid gap-4 sm:grid-cols-2">
      <TextField label="Gateway id" name="gatewayId" autoComplete="off" hint="Becomes the gateway's MQTT client id and username." error={errors.gatewayId} />
      <SelectField
        label="Unit"
        name="unitId"
        value={unitId}
        onChange={(e) => setUnitId(e.target.value)}
        options={[{ value: '', label: 'Choose a unit…' }, ...units.map((u) => ({ value: u.id, label: `${u.id} · ${u.name}` }))]}
        hint={current ? `Replaces and revokes its current gateway ${current}.` : undefined}
        error={errors.unitId}
      />
      <div className="flex flex-wrap items-center gap-4 sm:col-span-2">
        <Button type="submit" variant="primary" disabled={provision.isPending}>
          {provision.isPending ? 'Provisioning…' : 'Provision gateway'}
        </Button>
        {errors.form && <p role="alert" className="font-medium text-danger">{errors.form}</p>}
      </div>
    </form>
  );
}
