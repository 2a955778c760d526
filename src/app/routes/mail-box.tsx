import { PageHeader } from '../../components/ui/page-header';
import { Panel } from '../../components/ui/panel';
import { MailboxView } from '../../features/mail/components/mailbox-view';
import { RequireRole } from './require-role';

export function AdminMailboxPage() {
  return (
    <RequireRole roles={['admin']}>
      <PageHeader title="Mailbox" description="Messages the development mail fake received (alert mails and digests)." />
      <Panel><MailboxView /></Panel>
    </RequireRole>
  );
}
