import { DataTable, type Column } from '../../../components/ui/data-table';
import { formatDateTime } from '../../../lib/format';
import type { User } from '../types';
import { UserControls } from './user-controls';

export function UsersTable({ users, currentUserId }: { users: User[]; currentUserId: User['id'] | undefined }) {
  const columns: Column<User>[] = [
    { key: 'name', header: 'Name', cell: (u) => <span className="font-medium">{u.name}</span> },
    { key: 'email', header: 'E-mail', cell: (u) => u.email },
    {
      key: 'status',
      header: 'Status',
      cell: (u) =>
        u.active ? <span className="text-state-safe">Active</span> : <span className="text-muted">Deactivated</span>,
    },
    { key: 'access', header: 'Role and access', cell: (u) => <UserControls user={u} isSelf={String(u.id) === String(currentUserId)} /> },
    { key: 'lastLoginAt', header: 'Last sign-in', cell: (u) => (u.lastLoginAt ? formatDateTime(u.lastLoginAt) : 'never') },
    { key: 'createdAt', header: 'Created', cell: (u) => formatDateTime(u.createdAt) },
  ];
  return <DataTable caption="Users" columns={columns} rows={users} rowKey={(u) => String(u.id)} empty="No users yet." />;
}
