import { Button } from '../../../components/ui/button';
import { errorText } from '../../../components/ui/error-notice';
import { RoleSchema } from '../../../lib/session-store';
import { useUpdateUser } from '../api/update-user';
import { ROLE_LABELS, type User } from '../types';

/** Role and access of one account, with its own inline error. */
export function UserControls({ user, isSelf }: { user: User; isSelf: boolean }) {
  const update = useUpdateUser();
  return (
    <div className="flex flex-col gap-1">
      <div className="flex flex-wrap items-center gap-2">
        <label className="sr-only" htmlFor={`role-${user.id}`}>
          Role of {user.email}
        </label>
        <select
          id={`role-${user.id}`}
          value={user.role}
          disabled={update.isPending}
          onChange={(e) => {
            const role = RoleSchema.safeParse(e.target.value);
            if (role.success) update.mutate({ id: user.id, change: { role: role.data } });
          }}
          className="rounded-md border border-line bg-raised px-2 py-1 text-fg"
        >
          {Object.entries(ROLE_LABELS).map(([value, label]) => (
            <option key={value} value={value}>
              {label}
            </option>
          ))}
        </select>
        <Button
          size="sm"
          variant={user.active ? 'danger' : 'secondary'}
          disabled={update.isPending}
          onClick={() => update.mutate({ id: user.id, change: { active: !user.active } })}
        >
          {user.active ? 'Deactivate' : 'Reactivate'}
        </Button>
        {isSelf && <span className="text-sm text-muted">(you)</span>}
      </div>
      {update.isError && (
        <p role="alert" className="max-w-sm whitespace-normal text-sm font-medium text-danger">
          {errorText(update.error)}
        </p>
      )}
    </div>
  );
}
