import { Link, useParams } from 'react-router-dom';
import { ErrorNotice } from '../../components/ui/error-notice';
import { Loading } from '../../components/ui/loading';
import { PageHeader } from '../../components/ui/page-header';
import { Panel } from '../../components/ui/panel';
import { formatDateTime } from '../../lib/format';
import { useSession } from '../../lib/session';
import { useWorkOrder } from '../../features/work-orders/api/get-work-order';
import { AssignForm } from '../../features/work-orders/components/assign-form';
import { ChecksList } from '../../features/work-orders/components/checks-list';
import { CloseWorkOrderForm } from '../../features/work-orders/components/close-work-order-form';
import { CoilCheckForm } from '../../features/work-orders/components/coil-check-form';
import { PassFailCheckForm } from '../../features/work-orders/components/pass-fail-check-form';
import { PhotoPanel } from '../../features/work-orders/components/photo-panel';
import { WorkOrderSafetyNote } from '../../features/work-orders/components/safety-note';
import { CHECK_WORDS, OUTCOME_WORDS, SOURCE_WORDS, STATUS_WORDS } from '../../features/work-orders/lib/words';

export function WorkOrderDetailPage() {
  const id = Number(useParams().id);
  const current = useSession();
  const order = useWorkOrder(id);
  if (order.isPending) return <Loading label="Loading the work order…" />;
  if (order.isError) return <ErrorNotice title="Could not load the work order" error={order.error} />;
  const w = order.data;
  const open = w.status !== 'closed';
  const role = current?.user.role;
  const manages = role === 'admin' || role === 'planner';
  const records = open && role === 'technician' && String(w.assignee?.id) === String(current?.user.id);
  const sourceId = w.source.alertId ?? w.source.faultId ?? w.source.episodeId;
  return (
    <>
      <p className="mb-2"><Link to="/work-orders" className="text-accent underline">← Work orders</Link></p>
      <PageHeader title={`#${w.id} ${w.title}`} description={
        <>
          Unit <span className="font-mono">{w.unitId}</span> ({w.unitName}, {w.systemVoltage} V) at {w.depot} · from {SOURCE_WORDS[w.source.kind].toLowerCase()} #{sourceId}
          {w.source.episodeId && w.source.kind !== 'episode' ? ` (episode #${w.source.episodeId})` : ''} · opened {formatDateTime(w.createdAt)} by {w.createdBy ?? 'unknown'}
        </>
      } />
      <dl className="mb-6 grid gap-4 sm:grid-cols-3">
        <div><dt className="text-sm text-muted">Status</dt><dd className="text-xl font-semibold" data-testid="work-order-status">{STATUS_WORDS[w.status]}{w.outcome ? ` · ${OUTCOME_WORDS[w.outcome]}` : ''}</dd></div>
        <div><dt className="text-sm text-muted">Technician</dt><dd className="text-xl">{w.assignee ? `${w.assignee.name} (${w.assignee.email})` : 'not assigned'}</dd></div>
        <div><dt className="text-sm text-muted">Closed</dt><dd className="text-xl">{w.closedAt ? `${formatDateTime(w.closedAt)} by ${w.closedBy}` : '—'}</dd></div>
      </dl>
      {w.outcomeNote && <p className="mb-6">Closing note: {w.outcomeNote}</p>}
      {manages && open && <Panel title="Assign" className="mb-6"><AssignForm order={w} /></Panel>}
      <Panel title="Checks" className="mb-6">
        <WorkOrderSafetyNote />
        <div className="mt-4"><ChecksList checks={w.checks} /></div>
        {records && (
          <div className="mt-6 flex flex-col gap-6">
            <section aria-label={CHECK_WORDS.coilResistance}><h3 className="mb-2 font-semibold">{CHECK_WORDS.coilResistance}</h3><CoilCheckForm orderId={w.id} systemVoltage={w.systemVoltage} /></section>
            {(['defFreezeDamage', 'isolator', 'indicator'] as const).map((k) => (
              <section key={k}><h3 className="mb-2 font-semibold">{CHECK_WORDS[k]}</h3><PassFailCheckForm orderId={w.id} checkKey={k} /></section>
            ))}
          </div>
        )}
        {open && !records && role === 'technician' && <p className="mt-4 text-muted">Only the assigned technician records checks on this order.</p>}
      </Panel>
      <Panel title="Photos" className="mb-6"><PhotoPanel orderId={w.id} photos={w.photos} canUpload={records} /></Panel>
      {manages && open && <Panel title="Close"><CloseWorkOrderForm order={w} /></Panel>}
    </>
  );
}
