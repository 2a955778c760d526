import { useState } from 'react';
import { ErrorNotice } from '../../../components/ui/error-notice';
import { Loading } from '../../../components/ui/loading';
import { PageHeader } from '../../../components/ui/page-header';
import { Panel } from '../../../components/ui/panel';
import { compareValues } from '../../../lib/sort';
import { useGateways } from '../../../features/gateways/api/get-gateways';
import { GatewaysTable } from '../../../features/gateways/components/gateways-table';
import { ProvisionGatewayForm } from '../../../features/gateways/components/provision-gateway-form';
import { SecretDialog } from '../../../features/gateways/components/secret-dialog';
import type { ProvisionedGateway } from '../../../features/gateways/types';
import { useUnits } from '../../../features/units/api/get-units';
import { RequireRole } from '../require-role';

function GatewaysContent() {
  const gateways = useGateways();
  const units = useUnits({ refetchInterval: false });
  const [issued, setIssued] = useState<ProvisionedGateway | null>(null);
  const unitOptions = [...(units.data ?? [])].sort((a, b) => compareValues(a.id, b.id, 'asc'));
  // Active gateways first, then the revoked history.
  const rows = [...(gateways.data ?? [])].sort(
    (a, b) => Number(a.revokedAt !== null) - Number(b.revokedAt !== null) || compareValues(a.gatewayId, b.gatewayId, 'asc'),
  );
  return (
    <>
      <PageHeader title="Gateways" description="Each unit reports through one gateway. A gateway signs in to the broker with its id and secret." />
      <Panel title="Provision a gateway" className="mb-8">
        {units.isError ? <ErrorNotice title="Could not load the units" error={units.error} /> : <ProvisionGatewayForm units={unitOptions} onProvisioned={setIssued} />}
      </Panel>
      {gateways.isPending && <Loading label="Loading gateways…" />}
      {gateways.isError && <ErrorNotice title="Could not load the gateways" error={gateways.error} />}
      {gateways.data && <GatewaysTable gateways={rows} />}
      <SecretDialog gateway={issued} onClose={() => setIssued(null)} />
    </>
  );
}

export function AdminGatewaysPage() {
  return (
    <RequireRole roles={['admin']}>
      <GatewaysContent />
    </RequireRole>
  );
}
