import { useState } from 'react';
import { useNavigate, useSearchParams } from 'react-router-dom';
import { ErrorNotice } from '../../components/ui/error-notice';
import { SelectField } from '../../components/ui/field';
import { Loading } from '../../components/ui/loading';
import { PageHeader } from '../../components/ui/page-header';
import { Panel } from '../../components/ui/panel';
import { useSession } from '../../lib/session';
import { useWorkOrders } from '../../features/work-orders/api/get-work-orders';
import { OpenWorkOrderForm } from '../../features/work-orders/components/open-work-order-form';
import { WorkOrdersTable } from '../../features/work-orders/components/work-orders-table';

/** The list of work orders; planners and admins open new ones here (from ?alertId= when linked from an alert). */
export function WorkOrdersPage() {
  const current = useSession();
  const navigate = useNavigate();
  const [params] = useSearchParams();
  const [status, setStatus] = useState('active');
  const orders = useWorkOrders(status);
  const manages = current?.user.role === 'admin' || current?.user.role === 'planner';
  const alertId = Number(params.get('alertId')) || undefined;
  return (
    <>
      <PageHeader title="Work orders" description="Checks on a unit after an interrupted purge, a freeze warning or a fault, recorded by the assigned technician." />
      {manages && (
        <Panel title="Open a work order" className="mb-8">
          <OpenWorkOrderForm initialAlertId={alertId} onOpened={(w) => navigate(`/work-orders/${w.id}`)} />
        </Panel>
      )}
      <div className="mb-4 max-w-xs">
        <SelectField label="Show" value={status} onChange={(e) => setStatus(e.target.value)}
          options={[{ value: 'active', label: 'Open and in progress' }, { value: 'open', label: 'Open' }, { value: 'inProgress', label: 'In progress' }, { value: 'closed', label: 'Closed' }]} />
      </div>
      {orders.isPending && <Loading label="Loading work orders…" />}
      {orders.isError && <ErrorNotice title="Could not load the work orders" error={orders.error} />}
      {orders.data && <WorkOrdersTable orders={orders.data} />}
    </>
  );
}
