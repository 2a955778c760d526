import { DataTable, type Column } from '../../../components/ui/data-table';
import { formatDateTime } from '../../../lib/format';
import type { AuditEntry } from '../types';

function Details({ details }: { details: unknown }) {
  if (details === null || details === undefined) return <span className="text-muted">—</span>;
  const text = JSON.stringify(details);
  return (
    <code className="block max-w-xl truncate font-mono text-sm text-muted" title={JSON.stringify(details, null, 2)}>
      {text}
    </code>
  );
}

export function AuditTable({ entries }: { entries: AuditEntry[] }) {
  const columns: Column<AuditEntry>[] = [
    { key: 'at', header: 'When', cell: (e) => <span className="whitespace-nowrap">{formatDateTime(e.at)}</span> },
    { key: 'actor', header: 'Who', cell: (e) => e.actor?.email ?? <span className="text-muted">system</span> },
    { key: 'action', header: 'Action', cell: (e) => <span className="font-mono">{e.action}</span> },
    { key: 'target', header: 'Target', cell: (e) => <span className="font-mono">{e.target ?? '—'}</span> },
    { key: 'details', header: 'Details', cell: (e) => <Details details={e.details} /> },
  ];
  return <DataTable caption="Audit log" columns={columns} rows={entries} rowKey={(e) => String(e.id)} empty="Nothing recorded yet." />;
}
