import { ErrorNotice } from '../../components/ui/error-notice';
import { Loading } from '../../components/ui/loading';
import { PageHeader } from '../../components/ui/page-header';
import { Panel } from '../../components/ui/panel';
import { useSession } from '../../lib/session';
import { useUnits } from '../../features/units/api/get-units';
import { useDrivers } from '../../features/drivers/api/get-drivers';
import { useAssignments } from '../../features/drivers/api/assignments';
import { DriversTable } from '../../features/drivers/components/drivers-table';
import { DriverForm } from '../../features/drivers/components/driver-form';
import { AssignmentForm } from '../../features/drivers/components/assignment-form';
import { AssignmentsTable } from '../../features/drivers/components/assignments-table';
import { AssignmentImport } from '../../features/drivers/components/assignment-import';

/** Planners and admins manage drivers and assignments (server: drivers.manage); everyone may read. */
const MANAGERS = ['admin', 'planner'];

export function DriversPage() {
  const role = useSession()?.user.role;
  const canManage = role !== undefined && MANAGERS.includes(role);
  const drivers = useDrivers();
  const assignments = useAssignments();
  const unitIds = (useUnits().data ?? []).map((u) => u.id).sort();
  return (
    <>
      <PageHeader title="Drivers" description="Who drove which unit when. Each key-off is credited to the driver whose assignment covers it; open a driver for their coaching view." />
      <div className="flex flex-col gap-6">
        <Panel title="Drivers">
          {drivers.isPending && <Loading />}
          {drivers.isError && <ErrorNotice error={drivers.error} />}
          {drivers.data && <DriversTable drivers={drivers.data} />}
          {canManage && <div className="mt-4"><DriverForm /></div>}
        </Panel>
        {canManage && (
          <Panel title="Import assignments from a CSV file">
            <AssignmentImport />
          </Panel>
        )}
        <Panel title="Assignments">
          {canManage && drivers.data && <div className="mb-4"><AssignmentForm drivers={drivers.data.filter((d) => d.active)} unitIds={unitIds} /></div>}
          {assignments.isPending && <Loading />}
          {assignments.isError && <ErrorNotice error={assignments.error} />}
          {assignments.data && <AssignmentsTable rows={assignments.data} canManage={canManage} />}
        </Panel>
      </div>
    </>
  );
}
