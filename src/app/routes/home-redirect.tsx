import { Navigate } from 'react-router-dom';
import { useSession } from '../../lib/session';

/** The page after sign-in: the live board for those who watch the fleet, the units list for others. */
export function HomeRedirect() {
  const role = useSession()?.user.role;
  return <Navigate to={role === 'admin' || role === 'monitor' ? '/board' : '/units'} replace />;
}
