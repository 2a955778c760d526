import { Button } from '../../../components/ui/button';
import type { RosterCommitResult } from '../../../../shared/api/roster';
import { saveText } from '../api/roster';
import { secretsCsv } from '../lib/secrets-csv';

/** After the commit: the gateways' secrets, shown this once, downloadable as a CSV. */
export function RosterResult({ result }: { result: RosterCommitResult }) {
  return (
    <div className="flex flex-col gap-4" aria-label="Import result">
      <p className="text-lg">Created {result.units.length} units and {result.gateways.length} gateways.</p>
      {result.gateways.length > 0 && (
        <>
          <p role="alert" className="rounded-md border border-caution/50 bg-caution/10 px-3 py-2 font-medium">
            These gateway secrets are shown only now. Download them and hand them to whoever fits the gateways: they cannot be shown again.
          </p>
          <div><Button variant="primary" onClick={() => saveText('gateway-secrets.csv', secretsCsv(result))}>Download secrets (CSV)</Button></div>
          <ul className="flex flex-col gap-1 font-mono text-sm">
            {result.gateways.map((g) => <li key={g.gatewayId}>{g.unitId} · {g.gatewayId} · <code className="select-all break-all">{g.secret}</code></li>)}
          </ul>
        </>
      )}
    </div>
  );
}
