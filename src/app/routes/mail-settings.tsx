import { ErrorNotice } from '../../components/ui/error-notice';
import { Loading } from '../../components/ui/loading';
import { PageHeader } from '../../components/ui/page-header';
import { Panel } from '../../components/ui/panel';
import { useSession } from '../../lib/session';
import { useDepots } from '../../features/forecast/api/depots';
import { SubscriptionsPanel } from '../../features/mail/components/subscriptions-panel';

export function MailSettingsPage() {
  const current = useSession();
  const depots = useDepots();
  return (
    <>
      <PageHeader title="E-mail alerts" description="Get an e-mail when a purge is interrupted, a purge is unconfirmed in the cold, freezing weather is forecast over an unfinished purge, or an alert escalates, for the depots you choose. Planners also get a weekly digest." />
      <Panel>
        {depots.isPending && <Loading />}
        <ErrorNotice error={depots.error} />
        {depots.data && current && <SubscriptionsPanel depots={depots.data.map((d) => d.name)} me={Number(current.user.id)} isAdmin={current.user.role === 'admin'} />}
      </Panel>
    </>
  );
}
