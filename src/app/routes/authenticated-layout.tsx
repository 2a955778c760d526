import { useQueryClient } from '@tanstack/react-query';
import { useEffect } from 'react';
import { Navigate, Outlet, useLocation } from 'react-router-dom';
import { AppShell } from '../../components/layouts/app-shell';
import { session, useSession } from '../../lib/session';
import { useMe } from '../../features/auth/api/get-me';
import { LiveIndicator } from '../../components/ui/live-indicator';
import { liveStatus, useFleetFeed } from '../../lib/live-feed';
import { useStore } from '../../lib/live-store';
import { navFor } from '../nav';

/** Everything behind sign-in: the shell with the role's navigation, or a redirect to /sign-in. */
export function AuthenticatedLayout() {
  const current = useSession();
  const location = useLocation();
  const qc = useQueryClient();
  // Asks the server whether the stored token still holds (a 401 ends the session), and picks up
  // a role or name an admin changed since sign-in, so the navigation matches what the server allows.
  const me = useMe(current !== null);
  useEffect(() => {
    const u = me.data;
    const s = session.get();
    if (u && s && (u.role !== s.user.role || u.name !== s.user.name || u.email !== s.user.email)) session.set(s.token, u);
  }, [me.data]);
  // One fleet feed for every page behind sign-in; it writes into the query cache.
  useFleetFeed(current?.token ?? null);
  const status = useStore(liveStatus);

  if (!current) {
    // After a deliberate sign-out the next person starts from the default page.
    if (session.lastEndReason() === 'signedOut') return <Navigate to="/sign-in" replace />;
    const next = location.pathname + location.search;
    return <Navigate to={`/sign-in?next=${encodeURIComponent(next)}`} replace />;
  }
  return (
    <AppShell
      links={navFor(current.user.role)}
      user={current.user}
      status={<LiveIndicator status={status} />}
      onSignOut={() => {
        session.clear('signedOut');
        qc.clear();
      }}
    >
      <Outlet />
    </AppShell>
  );
}
