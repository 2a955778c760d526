import { useState, type FormEvent } from 'react';
import { Button } from '../../../components/ui/button';
import { Dialog } from '../../../components/ui/dialog';
import { errorText } from '../../../components/ui/error-notice';
import { ApiError } from '../../../lib/api-error';
import { issuesByField } from '../../../lib/form-data';
import { useUpdateUnit } from '../api/update-unit';
import { UnitProfileSchema } from '../api/unit-input';
import { readUnitProfile } from '../lib/read-unit-form';
import type { Unit } from '../types';
import { UnitProfileFields } from './unit-profile-fields';

export function EditProfileDialog({ unit, onClose }: { unit: Unit | null; onClose: () => void }) {
  const update = useUpdateUnit();
  const [errors, setErrors] = useState<Record<string, string>>({});
  const close = () => {
    setErrors({});
    update.reset();
    onClose();
  };

  function submit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    if (!unit) return;
    const parsed = UnitProfileSchema.safeParse(readUnitProfile(new FormData(e.currentTarget)));
    if (!parsed.success) return setErrors(issuesByField(parsed.error.issues));
    setErrors({});
    update.mutate(
      { id: unit.id, profile: parsed.data },
      {
        onSuccess: close,
        onError: (err) => {
          if (err instanceof ApiError && err.code === 'validation_error') setErrors({ ...err.fieldErrors(), form: err.message });
          else setErrors({ form: errorText(err) });
        },
      },
    );
  }

  return (
    <Dialog open={unit !== null} onClose={close} title={unit ? `Profile of ${unit.id}` : 'Profile'}>
      {unit && (
        <form onSubmit={submit} noValidate className="grid gap-4 sm:grid-cols-2">
          <p className="rounded-md bg-raised px-3 py-2 text-sm text-muted sm:col-span-2">
            Changes apply to purges that start after you save. Purges already running or judged keep the profile they
            started with.
          </p>
          <UnitProfileFields defaults={unit} errors={errors} />
          {errors.form && <p role="alert" className="font-medium text-danger sm:col-span-2">{errors.form}</p>}
          <div className="flex justify-end gap-2 sm:col-span-2">
            <Button onClick={close}>Cancel</Button>
            <Button type="submit" variant="primary" disabled={update.isPending}>
              {update.isPending ? 'Saving…' : 'Save profile'}
            </Button>
          </div>
        </form>
      )}
    </Dialog>
  );
}
