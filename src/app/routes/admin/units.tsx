import { useState } from 'react';
import { ErrorNotice } from '../../../components/ui/error-notice';
import { Loading } from '../../../components/ui/loading';
import { PageHeader } from '../../../components/ui/page-header';
import { Panel } from '../../../components/ui/panel';
import { compareValues } from '../../../lib/sort';
import { useUnits } from '../../../features/units/api/get-units';
import { CreateUnitForm } from '../../../features/units/components/create-unit-form';
import { EditProfileDialog } from '../../../features/units/components/edit-profile-dialog';
import { UnitProfilesTable } from '../../../features/units/components/unit-profiles-table';
import type { Unit } from '../../../features/units/types';
import { RequireRole } from '../require-role';

function UnitsAdminContent() {
  // Profiles change rarely; no polling here, so an open edit dialog keeps its values.
  const units = useUnits({ refetchInterval: false });
  const [editing, setEditing] = useState<Unit | null>(null);
  const sorted = [...(units.data ?? [])].sort((a, b) => compareValues(a.id, b.id, 'asc'));
  return (
    <>
      <PageHeader
        title="Units & profiles"
        description="Each unit's vehicle profile decides how its key-off purges are judged. Changes apply to purges that start after the change."
      />
      <Panel title="Add a unit" className="mb-8">
        <CreateUnitForm />
      </Panel>
      {units.isPending && <Loading label="Loading units…" />}
      {units.isError && <ErrorNotice title="Could not load the units" error={units.error} />}
      {units.data && <UnitProfilesTable units={sorted} onEdit={setEditing} />}
      <EditProfileDialog unit={editing} onClose={() => setEditing(null)} />
    </>
  );
}

export function AdminUnitsPage() {
  return (
    <RequireRole roles={['admin']}>
      <UnitsAdminContent />
    </RequireRole>
  );
}
