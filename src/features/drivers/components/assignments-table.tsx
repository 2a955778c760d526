import { Button } from '../../../components/ui/button';
import { DataTable, type Column } from '../../../components/ui/data-table';
import { formatDateTime } from '../../../lib/format';
import type { Assignment } from '../../../../shared/api/drivers';
import { useDeleteAssignment } from '../api/assignments';

export function AssignmentsTable({ rows, canManage }: { rows: Assignment[]; canManage: boolean }) {
  const del = useDeleteAssignment();
  const columns: Column<Assignment>[] = [
    { key: 'unit', header: 'Unit', cell: (a) => a.unitId },
    { key: 'driver', header: 'Driver', cell: (a) => `${a.driverName} (${a.driverCode})` },
    { key: 'from', header: 'From', cell: (a) => formatDateTime(a.from) },
    { key: 'to', header: 'To', cell: (a) => (a.to ? formatDateTime(a.to) : <span className="text-muted">still driving</span>) },
  ];
  if (canManage)
    columns.push({
      key: 'actions', header: '', align: 'right',
      cell: (a) => <Button size="sm" variant="danger" disabled={del.isPending} onClick={() => window.confirm(`Remove ${a.driverName}'s assignment of ${a.unitId}?`) && del.mutate(a.id)}>Remove</Button>,
    });
  return <DataTable caption="Driver assignments" columns={columns} rows={rows} rowKey={(a) => String(a.id)} empty="No assignments on file yet." />;
}
