import { Button } from '../../../components/ui/button';
import { ErrorNotice } from '../../../components/ui/error-notice';
import { Loading } from '../../../components/ui/loading';
import { PageHeader } from '../../../components/ui/page-header';
import { useAudit } from '../../../features/audit/api/get-audit';
import { AuditTable } from '../../../features/audit/components/audit-table';
import { RequireRole } from '../require-role';

function AuditContent() {
  const audit = useAudit();
  const entries = audit.data?.pages.flat() ?? [];
  return (
    <>
      <PageHeader
        title="Audit log"
        description="Who changed what: accounts, units, profiles and gateways. Newest first."
        actions={<Button onClick={() => audit.refetch()} disabled={audit.isFetching}>Refresh</Button>}
      />
      {audit.isPending && <Loading label="Loading the audit log…" />}
      {audit.isError && <ErrorNotice title="Could not load the audit log" error={audit.error} />}
      {audit.data && (
        <>
          <AuditTable entries={entries} />
          <div className="mt-4 flex justify-center">
            {audit.hasNextPage ? (
              <Button onClick={() => audit.fetchNextPage()} disabled={audit.isFetchingNextPage}>
                {audit.isFetchingNextPage ? 'Loading…' : 'Show older entries'}
              </Button>
            ) : (
              entries.length > 0 && <p className="text-muted">Start of the log.</p>
            )}
          </div>
        </>
      )}
    </>
  );
}

export function AdminAuditPage() {
  return (
    <RequireRole roles={['admin']}>
      <AuditContent />
    </RequireRole>
  );
}
