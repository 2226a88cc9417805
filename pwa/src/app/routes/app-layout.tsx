import { CORE_VERSION } from '@phasewright/physics-core';
import type { ReactNode } from 'react';
import { Link, NavLink, Outlet, useNavigate } from 'react-router-dom';
import { useSignOut } from '../../features/auth/api/sign-out.js';
import { SyncBadge } from '../../features/sync/components/sync-badge.js';
import { UpdatePrompt } from '../../features/sync/components/update-prompt.js';
import { useSession } from '../../lib/auth.js';
import { Badge } from '../../components/ui/badge.js';
import { Button } from '../../components/ui/button.js';
import { LogoMark } from '../../components/ui/logo-mark.js';
import { ThemeToggle } from '../../components/ui/theme-toggle.js';
import { dismissServiceWorkerNotice, useServiceWorkerState } from '../../lib/service-worker.js';
import { useOnlineStatus } from '../../lib/use-online-status.js';

const NAV_ITEMS = [
  { to: '/', label: 'Home', end: true },
  { to: '/projects', label: 'Projects', end: true },
  { to: '/projects/device', label: 'This device', end: false },
  { to: '/models/new', label: 'New model', end: true },
  { to: '/compare', label: 'Compare', end: true },
  { to: '/status', label: 'Status', end: false },
] as const;

/** Who is signed in (or a sign-in link), with sign-out and, for site admins, the mail page. */
function AccountArea() {
  const session = useSession();
  const signOut = useSignOut();
  const navigate = useNavigate();
  if (session === undefined) return null;
  if (session === null) {
    return (
      <Link to="/sign-in" className="rounded-md px-3 py-1.5 text-sm font-semibold text-accent-700 ring-1 ring-line hover:bg-accent-50">
        Sign in
      </Link>
    );
  }
  return (
    <div className="flex min-w-0 items-center gap-2 text-sm" data-testid="account">
      {/* A long name is cut to one line so the header keeps one row at 1280 px; the tooltip has it whole. */}
      <span className="max-w-28 truncate font-semibold text-ink-900" title={`${session.user.displayName} · ${session.user.email}`} data-testid="signed-in-user">
        {session.user.displayName}
      </span>
      {session.user.siteRole === 'admin' ? (
        <NavLink to="/admin/mail" className={navClass}>
          Mail
        </NavLink>
      ) : null}
      <button
        type="button"
        className="rounded-md px-2 py-1 text-sm font-semibold text-ink-700 hover:bg-ink-100"
        onClick={() => signOut.mutate(undefined, { onSettled: () => navigate('/') })}
      >
        Sign out
      </button>
    </div>
  );
}

function navClass({ isActive }: { isActive: boolean }): string {
  return `whitespace-nowrap rounded-md px-2.5 py-1.5 text-sm font-semibold transition-colors ${
    isActive ? 'bg-ink-900 text-paper' : 'text-ink-800 hover:bg-ink-100 hover:text-ink-950'
  }`;
}

/** "Ready offline" once; a new version gets the sync-aware update prompt instead. */
function ServiceWorkerNotice() {
  const { offlineReady, needRefresh } = useServiceWorkerState();
  if (needRefresh) return <UpdatePrompt />;
  if (!offlineReady) return null;
  return (
    <div
      role="status"
      className="fixed right-4 bottom-4 z-10 max-w-sm rounded-lg border border-line bg-surface p-4 shadow-lg"
    >
      <p className="text-sm text-ink-900">Phasewright is cached on this device and will open without a network.</p>
      <div className="mt-3 flex gap-2">
        <Button variant="secondary" onClick={dismissServiceWorkerNotice}>
          OK
        </Button>
      </div>
    </div>
  );
}

/** The frame around every page: header with the mark and navigation, footer with versions. */
export function AppShell({ children }: { children: ReactNode }) {
  const online = useOnlineStatus();
  return (
    <div className="flex min-h-screen flex-col font-sans">
      <a
        href="#main"
        className="sr-only focus:not-sr-only focus:absolute focus:top-2 focus:left-2 focus:z-20 focus:rounded-md focus:bg-surface focus:px-3 focus:py-2 focus:text-ink-900"
      >
        Skip to content
      </a>
      <header className="border-b-2 border-ink-900 bg-paper text-ink-900">
        <div className="mx-auto flex max-w-6xl flex-wrap items-center gap-x-2.5 gap-y-2 px-5 py-3">
          <NavLink to="/" className="flex items-center gap-2.5 rounded-md" aria-label="Phasewright, home">
            <LogoMark size={34} />
            <span className="text-lg font-bold tracking-tight">Phasewright</span>
          </NavLink>
          <nav aria-label="Main" className="flex flex-1 items-center gap-1">
            {NAV_ITEMS.map((item) => (
              <NavLink key={item.to} to={item.to} end={item.end} className={navClass}>
                {item.label}
              </NavLink>
            ))}
          </nav>
          {online ? null : <Badge tone="warn">Offline</Badge>}
          <SyncBadge />
          <ThemeToggle />
          <AccountArea />
        </div>
      </header>
      <main id="main" className="mx-auto w-full max-w-6xl flex-1 px-5 py-8">
        {children}
      </main>
      <footer className="border-t border-line">
        <div className="mx-auto flex max-w-6xl flex-wrap justify-between gap-2 px-5 py-4 text-sm text-ink-600">
          <span>Phasewright — phase diagrams of lattice bosons, computed in your browser.</span>
          <span data-testid="core-version">physics-core v{CORE_VERSION}</span>
        </div>
      </footer>
      <ServiceWorkerNotice />
    </div>
  );
}

export function AppLayout() {
  return (
    <AppShell>
      <Outlet />
    </AppShell>
  );
}

/** Shown while the first lazy page loads. */
export function ShellLoading() {
  return (
    <AppShell>
      <p className="text-ink-600" role="status">
        Loading…
      </p>
    </AppShell>
  );
}
