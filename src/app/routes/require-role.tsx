import type { ReactNode } from 'react';
import type { Role } from '../../lib/session-store';
import { useSession } from '../../lib/session';

/** Shows `children` only to the given roles; the server enforces the same rule on every request. */
export function RequireRole({ roles, children }: { roles: readonly Role[]; children: ReactNode }) {
  const current = useSession();
  if (!current || !roles.includes(current.user.role)) {
    return (
      <div role="alert" className="rounded-lg border border-line bg-panel p-8">
        <h1 className="text-2xl font-semibold">Not available to your role</h1>
        <p className="mt-2 text-muted">This page is for {roles.join(' or ')} accounts. Ask an administrator if you need it.</p>
      </div>
    );
  }
  return <>{children}</>;
}
