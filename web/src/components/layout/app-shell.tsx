import { useState, type ReactNode } from 'react';
import { NavLink, Outlet } from 'react-router';
import { Logo } from '../ui/logo';
import type { NavItem } from '../../app/nav';

/**
 * The frame of every signed-in screen: a tide-blue rail on wide screens, a top bar with a
 * menu on phones.
 */
export function AppShell({
  nav,
  status,
  account,
  notice,
  children,
}: {
  nav: NavItem[];
  status: ReactNode;
  /** The signed-in person's menu; given the close action of the phone menu. */
  account?: (closeMenu: () => void) => ReactNode;
  /** Shown above every screen (e.g. the offline note). */
  notice?: ReactNode;
  /** Shown instead of the matched route (e.g. "not allowed"). */
  children?: ReactNode;
}) {
  const [open, setOpen] = useState(false);
  const links = (
    <nav aria-label="Main" className="flex flex-col gap-1">
      {nav.map((item) => (
        <NavLink
          key={item.to}
          to={item.to}
          onClick={() => setOpen(false)}
          className={({ isActive }) =>
            `group rounded-lg px-3 py-2.5 transition ${
              isActive ? 'bg-tide-800 text-white shadow-inner' : 'text-tide-100 hover:bg-tide-800/60'
            }`
          }
        >
          <span className="block font-medium">{item.label}</span>
          <span className="block text-xs text-tide-200/80">{item.hint}</span>
        </NavLink>
      ))}
    </nav>
  );
  return (
    <div className="min-h-screen lg:flex" data-testid="app-shell">
      <aside className="hidden w-64 shrink-0 flex-col gap-6 bg-tide-900 p-4 lg:flex">
        <Brand />
        {links}
        <div className="mt-auto space-y-4 border-t border-tide-800 pt-4">
          {account?.(() => undefined)}
          {status}
        </div>
      </aside>
      <header className="sticky top-0 z-20 flex items-center justify-between bg-tide-900 px-4 py-3 lg:hidden">
        <Brand />
        <button
          type="button"
          className="rounded-lg border border-tide-600 px-3 py-1.5 text-sm text-tide-50"
          aria-expanded={open}
          aria-controls="mobile-nav"
          onClick={() => setOpen((v) => !v)}
        >
          {open ? 'Close' : 'Menu'}
        </button>
      </header>
      {open ? (
        <div id="mobile-nav" className="sticky top-14 z-10 space-y-4 bg-tide-900 px-4 pb-4 lg:hidden">
          {links}
          <div className="space-y-4 border-t border-tide-800 pt-3">
            {account?.(() => setOpen(false))}
            {status}
          </div>
        </div>
      ) : null}
      <main className="min-w-0 flex-1 px-4 py-6 sm:px-8 sm:py-8">
        {notice}
        {children ?? <Outlet />}
      </main>
    </div>
  );
}

function Brand() {
  return (
    <NavLink to="/" className="flex items-center gap-2.5 text-white">
      <Logo />
      <span className="text-lg font-bold tracking-tight">
        Ebbline<span className="ml-1.5 hidden text-xs font-normal text-tide-200 sm:inline">DC-link health</span>
      </span>
    </NavLink>
  );
}
