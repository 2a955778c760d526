import { Link } from 'react-router-dom';
import { DataTable, type Column } from '../../../components/ui/data-table';
import { formatDateTime } from '../../../lib/format';
import type { WorkOrderView } from '../../../../shared/api/work-orders';
import { OUTCOME_WORDS, SOURCE_WORDS, STATUS_WORDS } from '../lib/words';

export function WorkOrdersTable({ orders }: { orders: WorkOrderView[] }) {
  const columns: Column<WorkOrderView>[] = [
    { key: 'id', header: 'No.', cell: (w) => <Link className="font-mono text-accent underline" to={`/work-orders/${w.id}`}>#{w.id}</Link> },
    { key: 'title', header: 'Work order', cell: (w) => w.title },
    { key: 'unit', header: 'Unit', cell: (w) => <span className="font-mono">{w.unitId}</span> },
    { key: 'depot', header: 'Depot', cell: (w) => w.depot },
    { key: 'source', header: 'From', cell: (w) => SOURCE_WORDS[w.source.kind] },
    { key: 'assignee', header: 'Technician', cell: (w) => w.assignee?.name ?? <span className="text-muted">not assigned</span> },
    { key: 'status', header: 'Status', cell: (w) => (w.outcome ? `${STATUS_WORDS[w.status]} · ${OUTCOME_WORDS[w.outcome]}` : STATUS_WORDS[w.status]) },
    { key: 'created', header: 'Opened', cell: (w) => formatDateTime(w.createdAt) },
  ];
  return <DataTable caption="Work orders" columns={columns} rows={orders} rowKey={(w) => String(w.id)} empty="No work orders here." />;
}
