import { Button } from '../../../components/ui/button';
import { CopyButton } from '../../../components/ui/copy-button';
import { Dialog } from '../../../components/ui/dialog';
import type { ProvisionedGateway } from '../types';

/** Shows a new gateway's secret once. Closing it forgets the secret; only a new gateway gets a new one. */
export function SecretDialog({ gateway, onClose }: { gateway: ProvisionedGateway | null; onClose: () => void }) {
  return (
    <Dialog
      open={gateway !== null}
      onClose={onClose}
      dismissible={false}
      title="Gateway secret"
      footer={
        <Button variant="primary" onClick={onClose}>
          I have stored the secret
        </Button>
      }
    >
      {gateway && (
        <div className="flex flex-col gap-4">
          <p role="alert" className="rounded-md border border-caution/50 bg-caution/10 px-3 py-2 font-medium text-fg">
            This secret is shown only now. It cannot be shown again: if it is lost, provision the gateway anew.
          </p>
          <dl className="flex flex-col gap-1">
            <dt className="text-muted">Gateway id (MQTT client id and username)</dt>
            <dd className="mb-3 font-mono text-lg">{gateway.gatewayId}</dd>
            <dt className="text-muted">Secret (MQTT password)</dt>
            <dd>
              <code className="block break-all rounded-md bg-raised px-3 py-2 font-mono text-lg select-all">{gateway.secret}</code>
            </dd>
          </dl>
          <CopyButton text={gateway.secret} label="Copy secret" />
        </div>
      )}
    </Dialog>
  );
}
