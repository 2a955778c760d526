import { useState } from 'react';
import { useSearchParams } from 'react-router-dom';
import type { AlertView } from '../../../shared/realtime/envelope';
import { CautionNote } from '../../components/ui/caution-note';
import { ErrorNotice } from '../../components/ui/error-notice';
import { Loading } from '../../components/ui/loading';
import { PageHeader } from '../../components/ui/page-header';
import type { AlertStatusFilter } from '../../lib/alert-cache';
import { useSession } from '../../lib/session';
import type { AlertAction } from '../../features/alerts/api/alert-actions';
import { useAlerts } from '../../features/alerts/api/get-alerts';
import { AlertActionDialog, type PendingAction } from '../../features/alerts/components/alert-action-dialog';
import { AlertsTable } from '../../features/alerts/components/alerts-table';
import { ALERT_ACTION } from '../../features/alerts/lib/alert-words';

const TABS: { status: AlertStatusFilter; label: string }[] = [
  { status: 'open', label: 'Open' },
  { status: 'acknowledged', label: 'Acknowledged' },
  { status: 'resolved', label: 'Resolved' },
  { status: 'all', label: 'All' },
];

export function AlertsPage() {
  const [params, setParams] = useSearchParams();
  const status = TABS.find((t) => t.status === params.get('status'))?.status ?? 'open';
  const alerts = useAlerts({ status });
  const role = useSession()?.user.role;
  const canAct = role === 'admin' || role === 'monitor';
  const [pending, setPending] = useState<PendingAction | null>(null);

  return (
    <>
      <PageHeader
        title="Alerts"
        description={
          canAct
            ? 'Purges that did not finish, or whose end was not seen. Acknowledge when someone is on it; resolve once the purge has been run again.'
            : 'Purges that did not finish, or whose end was not seen. Monitors and administrators acknowledge and resolve them.'
        }
      />
      <div role="tablist" aria-label="Alert status" className="mb-4 flex flex-wrap gap-1 border-b border-line">
        {TABS.map((t) => (
          <button
            key={t.status}
            role="tab"
            type="button"
            aria-selected={t.status === status}
            onClick={() => setParams(t.status === 'open' ? {} : { status: t.status }, { replace: true })}
            className={`-mb-px border-b-2 px-4 py-2 text-lg font-medium ${
              t.status === status ? 'border-accent text-fg' : 'border-transparent text-muted hover:text-fg'
            }`}
          >
            {t.label}
          </button>
        ))}
      </div>
      {alerts.isPending && <Loading label="Loading alerts…" />}
      {alerts.isError && <ErrorNotice title="Could not load the alerts" error={alerts.error} />}
      {alerts.data && (
        <AlertsTable alerts={alerts.data} canAct={canAct} onAction={(alert: AlertView, action: AlertAction) => setPending({ alert, action })} />
      )}
      <CautionNote className="mt-8">
        {ALERT_ACTION} The vehicle and engine manufacturers' procedures, your workshop's rules and local regulations come first.
      </CautionNote>
      <AlertActionDialog pending={pending} onClose={() => setPending(null)} />
    </>
  );
}
