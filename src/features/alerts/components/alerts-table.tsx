import { Link } from 'react-router-dom';
import type { AlertView } from '../../../../shared/realtime/envelope';
import { Button } from '../../../components/ui/button';
import { DataTable, type Column } from '../../../components/ui/data-table';
import { formatCelsius, formatDateTime } from '../../../lib/format';
import { freezeWords } from '../../../lib/freeze-words';
import type { AlertAction } from '../api/alert-actions';
import { KIND_LABELS, STATUS_LABELS, secondsIntoWords } from '../lib/alert-words';

const statusTone: Record<AlertView['status'], string> = {
  open: 'border-state-interrupted/70 text-state-interrupted',
  acknowledged: 'border-caution/60 text-caution',
  resolved: 'border-line text-muted',
};

// Open = filled triangle, acknowledged = outlined triangle, resolved = check: the status reads without colour.
function StatusMark({ status }: { status: AlertView['status'] }) {
  return (
    <svg viewBox="0 0 20 20" aria-hidden="true" className="h-4 w-4 shrink-0">
      {status === 'open' && <path d="M10 2 19 18H1z" fill="currentColor" />}
      {status === 'acknowledged' && <path d="M10 3 18 17H2z" fill="none" stroke="currentColor" strokeWidth="2" strokeLinejoin="round" />}
      {status === 'resolved' && <path d="m4 10.5 4 4 8-9" fill="none" stroke="currentColor" strokeWidth="2.2" strokeLinecap="round" />}
    </svg>
  );
}

export function EscalatedMark({ at }: { at: string }) {
  return (
    <span title={`Escalated ${formatDateTime(at)}`} className="inline-flex items-center gap-1 rounded border-2 border-danger px-1.5 text-sm font-bold uppercase tracking-wide text-danger">
      <svg viewBox="0 0 12 12" aria-hidden="true" className="h-3 w-3">
        <path d="M6 1 11 7H8v4H4V7H1z" fill="currentColor" />
      </svg>
      Escalated
    </span>
  );
}

function Who({ by, at }: { by: string | null; at: string | null }) {
  if (!at) return <span className="text-muted">—</span>;
  return (
    <span className="leading-tight">
      <span className="block">{by ?? 'unknown'}</span>
      <span className="block text-sm text-muted">{formatDateTime(at)}</span>
    </span>
  );
}

export interface AlertsTableProps {
  alerts: AlertView[];
  canAct: boolean;
  onAction: (alert: AlertView, action: AlertAction) => void;
}

export function AlertsTable({ alerts, canAct, onAction }: AlertsTableProps) {
  const columns: Column<AlertView>[] = [
    {
      key: 'status',
      header: 'Status',
      cell: (a) => (
        <span className="flex flex-col items-start gap-1">
          <span className={`inline-flex items-center gap-1.5 rounded-md border px-2 py-0.5 font-semibold ${statusTone[a.status]}`}>
            <StatusMark status={a.status} />
            {STATUS_LABELS[a.status]}
          </span>
          {a.escalatedAt && <EscalatedMark at={a.escalatedAt} />}
        </span>
      ),
    },
    {
      key: 'kind',
      header: 'Alert',
      cell: (a) => (
        <span className="leading-tight">
          <span className="block font-medium">{KIND_LABELS[a.kind]}</span>
          <span className="block text-sm text-muted">{formatDateTime(a.raisedAt)}</span>
        </span>
      ),
    },
    {
      key: 'unit',
      header: 'Unit',
      cell: (a) => (
        <span className="leading-tight">
          <Link to={`/units/${encodeURIComponent(a.unitId)}`} className="font-mono font-medium text-accent hover:underline">
            {a.unitId}
          </Link>
          <span className="block text-sm text-muted">{a.depot}</span>
        </span>
      ),
    },
    {
      key: 'purge',
      header: 'Purge',
      className: 'whitespace-normal min-w-48',
      cell: (a) => (
        <span className="leading-tight">
          <span className="block font-mono tabular-nums">
            {secondsIntoWords(a.secondsIntoPurge)} in · {formatCelsius(a.ambientC)}
          </span>
          <span className="block text-sm text-muted">{freezeWords(a.freezeExposure)}</span>
        </span>
      ),
    },
    { key: 'ack', header: 'Acknowledged', cell: (a) => <Who by={a.acknowledgedBy} at={a.acknowledgedAt} /> },
    { key: 'resolved', header: 'Resolved', cell: (a) => <Who by={a.resolvedBy} at={a.resolvedAt} /> },
    { key: 'comment', header: 'Comment', className: 'whitespace-normal min-w-40 max-w-xs', cell: (a) => a.comment ?? <span className="text-muted">—</span> },
  ];
  if (canAct) {
    columns.push({
      key: 'actions',
      header: 'Actions',
      cell: (a) =>
        a.status === 'resolved' ? null : (
          <span className="flex gap-2">
            {a.status === 'open' && (
              <Button size="sm" onClick={() => onAction(a, 'acknowledge')}>
                Acknowledge
              </Button>
            )}
            <Button size="sm" onClick={() => onAction(a, 'resolve')}>
              Resolve
            </Button>
          </span>
        ),
    });
  }
  return <DataTable caption="Alerts" columns={columns} rows={alerts} rowKey={(a) => String(a.id)} empty="No alerts here." />;
}
