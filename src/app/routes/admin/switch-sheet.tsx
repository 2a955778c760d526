import { useSearchParams } from 'react-router-dom';
import { Button } from '../../../components/ui/button';
import { ErrorNotice, errorText } from '../../../components/ui/error-notice';
import { Loading } from '../../../components/ui/loading';
import { PageHeader } from '../../../components/ui/page-header';
import { useIssueMany, useSwitchSheet } from '../../../features/switch/api/switch-admin';
import { QrCard } from '../../../features/switch/components/qr-card';
import { useUnits } from '../../../features/units/api/get-units';
import { depotsOf } from '../../../features/units/lib/filter-units';
import { RequireRole } from '../require-role';

function SwitchSheetContent() {
  const [params, setParams] = useSearchParams();
  const depot = params.get('depot') || undefined;
  const units = useUnits({ refetchInterval: false });
  const sheet = useSwitchSheet(depot);
  const issueMany = useIssueMany();
  const depots = depotsOf(units.data ?? []);
  const withPage = new Set((sheet.data ?? []).map((e) => e.unitId));
  const missing = depot && sheet.data ? (units.data ?? []).filter((u) => u.depot === depot && !withPage.has(u.id)).map((u) => u.id) : [];

  return (
    <>
      <div className="print:hidden">
        <PageHeader
          title="Switch page codes"
          description="Print these cards and fix each beside its unit's isolator. Each code opens that unit's hold / clear page without sign-in."
          actions={<Button onClick={() => window.print()}>Print</Button>}
        />
        <div className="mb-6 flex flex-wrap items-end gap-4">
          <label className="flex flex-col gap-1 text-sm font-medium text-muted">
            Depot
            <select
              value={depot ?? ''}
              onChange={(e) => setParams(e.target.value ? { depot: e.target.value } : {}, { replace: true })}
              className="rounded-md border border-line bg-raised px-3 py-2 text-base text-fg"
            >
              <option value="">All depots</option>
              {depots.map((d) => (
                <option key={d} value={d}>
                  {d}
                </option>
              ))}
            </select>
          </label>
          {depot && (
            <Button variant="primary" disabled={missing.length === 0 || issueMany.isPending} onClick={() => issueMany.mutate(missing)}>
              {issueMany.isPending
                ? 'Issuing…'
                : missing.length === 0
                  ? `Every unit of ${depot} has a page`
                  : `Issue pages for the ${missing.length} unit${missing.length === 1 ? '' : 's'} of ${depot} without one`}
            </Button>
          )}
          {!depot && <p className="text-muted">Choose a depot to issue pages for its units that have none.</p>}
        </div>
        {issueMany.isError && (
          <p role="alert" className="mb-4 font-medium text-danger">
            {errorText(issueMany.error)}
          </p>
        )}
      </div>
      {sheet.isPending && <Loading label="Loading codes…" />}
      {sheet.isError && <ErrorNotice title="Could not load the codes" error={sheet.error} />}
      {sheet.data && sheet.data.length === 0 && <p className="py-8 text-center text-lg text-muted">No switch pages issued here yet.</p>}
      {sheet.data && sheet.data.length > 0 && (
        <div className="qr-sheet grid grid-cols-[repeat(auto-fill,minmax(15rem,1fr))] gap-4 print:grid-cols-3 print:gap-0">
          {sheet.data.map((e) => (
            <QrCard key={e.unitId} entry={e} />
          ))}
        </div>
      )}
    </>
  );
}

export function AdminSwitchSheetPage() {
  return (
    <RequireRole roles={['admin']}>
      <SwitchSheetContent />
    </RequireRole>
  );
}
