import { ErrorNotice } from '../../../components/ui/error-notice';
import { Loading } from '../../../components/ui/loading';
import { PageHeader } from '../../../components/ui/page-header';
import { Panel } from '../../../components/ui/panel';
import { useSession } from '../../../lib/session';
import { useUsers } from '../../../features/users/api/get-users';
import { CreateUserForm } from '../../../features/users/components/create-user-form';
import { UsersTable } from '../../../features/users/components/users-table';
import { RequireRole } from '../require-role';

function UsersContent() {
  const users = useUsers();
  const current = useSession();
  return (
    <>
      <PageHeader title="Users" description="Accounts and their roles. Deactivated accounts cannot sign in." />
      <Panel title="Add a user" className="mb-8">
        <CreateUserForm />
      </Panel>
      {users.isPending && <Loading label="Loading users…" />}
      {users.isError && <ErrorNotice title="Could not load the users" error={users.error} />}
      {users.data && <UsersTable users={users.data} currentUserId={current?.user.id} />}
    </>
  );
}

export function AdminUsersPage() {
  return (
    <RequireRole roles={['admin']}>
      <UsersContent />
    </RequireRole>
  );
}
