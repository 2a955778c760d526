import { useState } from 'react';
import { Button } from '../../../components/ui/button';
import { DataTable, type Column } from '../../../components/ui/data-table';
import { Dialog } from '../../../components/ui/dialog';
import { errorText } from '../../../components/ui/error-notice';
import { formatDateTime } from '../../../lib/format';
import { useRevokeGateway } from '../api/revoke-gateway';
import type { Gateway } from '../types';

function Connection({ g }: { g: Gateway }) {
  if (g.revokedAt) return <span className="text-muted">Revoked {formatDateTime(g.revokedAt)}</span>;
  return g.connected ? (
    <span className="inline-flex items-center gap-2 text-state-safe">
      <span aria-hidden="true" className="h-2.5 w-2.5 rounded-full bg-current" /> Connected
    </span>
  ) : (
    <span className="inline-flex items-center gap-2 text-muted">
      <span aria-hidden="true" className="h-2.5 w-2.5 rounded-full border-2 border-current" /> Not connected
    </span>
  );
}

export function GatewaysTable({ gateways }: { gateways: Gateway[] }) {
  const revoke = useRevokeGateway();
  const [confirming, setConfirming] = useState<Gateway | null>(null);
  const mono = 'font-mono';
  const columns: Column<Gateway>[] = [
    { key: 'gatewayId', header: 'Gateway', cell: (g) => <span className={`${mono} font-medium`}>{g.gatewayId}</span> },
    { key: 'unitId', header: 'Unit', cell: (g) => <span className={mono}>{g.unitId}</span> },
    { key: 'status', header: 'Status', cell: (g) => <Connection g={g} /> },
    { key: 'lastSeenAt', header: 'Last seen', cell: (g) => formatDateTime(g.lastSeenAt) },
    { key: 'createdAt', header: 'Provisioned', cell: (g) => formatDateTime(g.createdAt) },
    {
      key: 'revoke',
      header: '',
      align: 'right',
      cell: (g) =>
        g.revokedAt ? null : (
          <Button size="sm" variant="danger" onClick={() => { revoke.reset(); setConfirming(g); }}>
            Revoke
          </Button>
        ),
    },
  ];
  const close = () => setConfirming(null);
  return (
    <>
      <DataTable caption="Gateways" columns={columns} rows={gateways} rowKey={(g) => g.gatewayId} empty="No gateways provisioned yet." />
      <Dialog
        open={confirming !== null}
        onClose={close}
        title={`Revoke gateway ${confirming?.gatewayId ?? ''}?`}
        footer={
          <>
            <Button onClick={close}>Keep it</Button>
            <Button
              variant="danger"
              disabled={revoke.isPending}
              onClick={() => confirming && revoke.mutate(confirming.gatewayId, { onSuccess: close })}
            >
              {revoke.isPending ? 'Revoking…' : 'Revoke gateway'}
            </Button>
          </>
        }
      >
        <p>
          The gateway's secret stops working at once and unit <span className="font-mono">{confirming?.unitId}</span> stops
          reporting until a new gateway is provisioned for it.
        </p>
        {revoke.isError && <p role="alert" className="mt-3 font-medium text-danger">{errorText(revoke.error)}</p>}
      </Dialog>
    </>
  );
}
