import { PageHeader } from '../../components/ui/page-header';
import { Panel } from '../../components/ui/panel';
import { RosterImport } from '../../features/roster/components/roster-import';
import { RequireRole } from './require-role';

export function AdminRosterPage() {
  return (
    <RequireRole roles={['admin']}>
      <PageHeader title="Fleet roster import" description="Create many units and their gateways from one CSV file: every row is checked first, then all are created together or none." />
      <Panel><RosterImport /></Panel>
    </RequireRole>
  );
}
