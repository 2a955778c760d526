import type { ReactNode } from 'react';
import { NavLink } from 'react-router-dom';
import { Button } from '../ui/button';
import { Logo } from '../ui/logo';

export interface ShellLink {
  to: string;
  label: string;
  group: 'main' | 'admin';
}

export interface AppShellProps {
  links: ShellLink[];
  user: { name: string; email: string; role: string };
  onSignOut: () => void;
  /** Shown beside the user, e.g. the live feed's connection indicator. */
  status?: ReactNode;
  children: ReactNode;
}

const linkClass = ({ isActive }: { isActive: boolean }) =>
  `rounded-md border-b-2 px-3 py-2 text-base font-medium transition-colors ${
    isActive ? 'border-accent bg-raised text-fg' : 'border-transparent text-muted hover:bg-raised/60 hover:text-fg'
  }`;

function Wordmark() {
  return (
    <span className="flex items-center gap-2.5 text-xl font-semibold tracking-tight">
      <Logo />
      Afterwatch
    </span>
  );
}

export function AppShell({ links, user, onSignOut, status, children }: AppShellProps) {
  const main = links.filter((l) => l.group === 'main');
  const admin = links.filter((l) => l.group === 'admin');
  return (
    <div className="flex min-h-screen flex-col">
      <header className="border-b border-line bg-panel print:hidden">
        <div className="mx-auto flex max-w-[110rem] flex-wrap items-center gap-x-6 gap-y-2 px-6 py-3">
          <Wordmark />
          <nav aria-label="Main" className="flex flex-wrap items-center gap-1">
            {main.map((l) => (
              <NavLink key={l.to} to={l.to} className={linkClass}>
                {l.label}
              </NavLink>
            ))}
            {admin.length > 0 && (
              <>
                <span className="ml-3 mr-1 text-sm font-semibold uppercase tracking-wider text-muted/80" aria-hidden="true">
                  Admin
                </span>
                {admin.map((l) => (
                  <NavLink key={l.to} to={l.to} className={linkClass} aria-label={`Admin: ${l.label}`}>
                    {l.label}
                  </NavLink>
                ))}
              </>
            )}
          </nav>
          <div className="ml-auto flex items-center gap-3">
            {status}
            <span className="text-right leading-tight">
              <span className="block font-medium">{user.name}</span>
              <span className="block text-sm text-muted">
                {user.email} · {user.role}
              </span>
            </span>
            <Button size="sm" onClick={onSignOut}>
              Sign out
            </Button>
          </div>
        </div>
      </header>
      <main className="mx-auto w-full max-w-[110rem] flex-1 px-6 py-8">{children}</main>
    </div>
  );
}
