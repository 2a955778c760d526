import { Navigate, useNavigate, useSearchParams } from 'react-router-dom';
import { Logo } from '../../components/ui/logo';
import { SignInForm } from '../../features/auth/components/sign-in-form';
import { session, useSession } from '../../lib/session';

const endNotice = {
  expired: 'Your session expired. Sign in again.',
  rejected: 'Your session is no longer valid. Sign in again.',
  signedOut: 'You have signed out.',
} as const;

/** Only same-site paths, so a crafted link cannot send someone elsewhere after sign-in. */
function safeNext(next: string | null): string {
  return next && next.startsWith('/') && !next.startsWith('//') ? next : '/';
}

export function SignInPage() {
  const current = useSession();
  const navigate = useNavigate();
  const [params] = useSearchParams();
  const next = safeNext(params.get('next'));
  if (current) return <Navigate to={next} replace />;
  const reason = session.lastEndReason();

  return (
    <main className="flex min-h-screen items-center justify-center px-4">
      <div className="w-full max-w-md">
        <div className="mb-8 text-center">
          <Logo className="mx-auto mb-3 h-12 w-12" />
          <h1 className="text-4xl font-semibold tracking-tight">Afterwatch</h1>
          <p className="mt-2 text-muted">Key-off purges watched, isolators opened at the right time.</p>
        </div>
        <div className="rounded-lg border border-line bg-panel p-6 shadow-xl">
          <h2 className="mb-4 text-xl font-semibold">Sign in</h2>
          {reason && <p className="mb-4 rounded-md bg-raised px-3 py-2 text-muted" role="status">{endNotice[reason]}</p>}
          <SignInForm onSignedIn={() => navigate(next, { replace: true })} />
          <p className="mt-4 text-sm text-muted">Accounts are created by an administrator.</p>
        </div>
      </div>
    </main>
  );
}
