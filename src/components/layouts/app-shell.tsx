import type { ReactNode } from 'react';
import { NavLink } from 'react-router-dom';
import { Button } from '../ui/button';
import { Logo } from '../ui/logo';

export interface ShellLink {
  to: string;
  label: string;
  group: 'main' | 'plan' | 'admin';
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
  `rounded-md border-b-2 px-2.5 py-1.5 text-[0.95rem] font-medium transition-colors ${
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
  // Three groups on a row of their own, so that the header does not wrap at random places.
  const groups = [
    { label: 'Live', links: links.filter((l) => l.group === 'main') },
    { label: 'Planning', links: links.filter((l) => l.group === 'plan') },
    { label: 'Admin', links: links.filter((l) => l.group === 'admin') },
  ].filter((g) => g.links.length > 0);
  return (
    <div className="flex min-h-screen flex-col">
      <header className="border-b border-line bg-panel print:hidden">
        <div className="mx-auto flex max-w-[110rem] flex-wrap items-center gap-x-6 gap-y-2 px-6 py-3">
          <Wordmark />
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
        <nav aria-label="Main" className="mx-auto flex max-w-[110rem] flex-wrap items-center gap-x-5 gap-y-1 px-6 pb-2">
          {groups.map((g) => (
            <div key={g.label} className="flex flex-wrap items-center gap-1">
              <span className="mr-1 text-xs font-semibold uppercase tracking-wider text-muted/80" aria-hidden="true">
                {g.label}
              </span>
              {g.links.map((l) => (
                <NavLink key={l.to} to={l.to} className={linkClass} aria-label={g.label === 'Admin' ? `Admin: ${l.label}` : undefined}>
                  {l.label}
                </NavLink>
              ))}
            </div>
          ))}
        </nav>
      </header>
      <main className="mx-auto w-full max-w-[110rem] flex-1 px-6 py-8">{children}</main>
    </div>
  );
}
