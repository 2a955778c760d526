import { Button } from '../../../components/ui/button';
import { DataTable, type Column } from '../../../components/ui/data-table';
import type { Unit } from '../types';

export function UnitProfilesTable({ units, onEdit }: { units: Unit[]; onEdit: (unit: Unit) => void }) {
  const mono = 'font-mono tabular-nums';
  const columns: Column<Unit>[] = [
    { key: 'id', header: 'Unit', cell: (u) => <span className={`${mono} font-medium`}>{u.id}</span> },
    { key: 'name', header: 'Name', cell: (u) => u.name },
    { key: 'depot', header: 'Depot', cell: (u) => u.depot },
    { key: 'systemVoltage', header: 'System', align: 'right', cell: (u) => <span className={mono}>{u.systemVoltage} V</span> },
    { key: 'purgeSeconds', header: 'Purge time', align: 'right', cell: (u) => <span className={mono}>{u.purgeSeconds} s</span> },
    { key: 'lossThresholdV', header: 'Loss below', align: 'right', cell: (u) => <span className={mono}>{u.lossThresholdV.toFixed(1)} V</span> },
    {
      key: 'linkSpns',
      header: 'Linked SPNs',
      cell: (u) => (u.linkSpns && u.linkSpns.length > 0 ? <span className={mono}>{u.linkSpns.join(', ')}</span> : <span className="text-muted">all</span>),
    },
    {
      key: 'gatewayId',
      header: 'Gateway',
      cell: (u) => (u.gatewayId ? <span className={mono}>{u.gatewayId}</span> : <span className="text-muted">none</span>),
    },
    {
      key: 'edit',
      header: '',
      align: 'right',
      cell: (u) => (
        <Button size="sm" onClick={() => onEdit(u)} aria-label={`Edit profile of ${u.id}`}>
          Edit profile
        </Button>
      ),
    },
  ];
  return <DataTable caption="Unit profiles" columns={columns} rows={units} rowKey={(u) => u.id} empty="No units yet." />;
}
