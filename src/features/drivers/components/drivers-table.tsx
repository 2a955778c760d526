import { Link } from 'react-router-dom';
import { DataTable, type Column } from '../../../components/ui/data-table';
import type { Driver } from '../../../../shared/api/drivers';

const COLUMNS: Column<Driver>[] = [
  { key: 'code', header: 'Code', cell: (d) => d.code },
  { key: 'name', header: 'Name', cell: (d) => <Link to={`/drivers/${d.id}`} className="font-medium underline">{d.name}</Link> },
  { key: 'depot', header: 'Depot', cell: (d) => d.depot ?? '—' },
  { key: 'active', header: 'Active', cell: (d) => (d.active ? 'Yes' : 'No') },
];

export function DriversTable({ drivers }: { drivers: Driver[] }) {
  return <DataTable caption="Drivers" columns={COLUMNS} rows={drivers} rowKey={(d) => String(d.id)} empty="No drivers yet: add one or import assignments." />;
}
