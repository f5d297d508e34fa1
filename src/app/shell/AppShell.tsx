import { useState } from 'react';
import { NavLink, Outlet, useNavigate } from 'react-router-dom';
import { useQuery } from '@tanstack/react-query';
import { ROLE_LABELS } from '@shared/roles';
import { Button, cn } from '@/components/ui';
import { shopQuery } from '@/lib/shop-query';
import { useCurrentUser, useAuth } from '@/lib/auth';
import { paths } from '@/config/paths';
import { ADMIN_NAV, NAV } from '../nav';

function ShopName() {
  const shop = useQuery(shopQuery());
  return <span className="truncate">{shop.data?.name ?? 'Pullbook'}</span>;
}

/** Header with the shop's name, role-based navigation, and the signed-in user's menu. */
export function AppShell() {
  const user = useCurrentUser();
  const { signOut } = useAuth();
  const navigate = useNavigate();
  const [menuOpen, setMenuOpen] = useState(false);
  const items = NAV.filter((n) => n.roles.includes(user.role));
  const admin = ADMIN_NAV.filter((n) => n.roles.includes(user.role));
  const linkClass = ({ isActive }: { isActive: boolean }) =>
    cn('focus-ring flex min-h-touch items-center rounded-control px-3 text-sm font-medium', isActive ? 'bg-paper-sunk text-ink' : 'text-ink-muted hover:text-ink hover:bg-paper-sunk');

  return (
    <div className="min-h-screen bg-paper">
      <a href="#main" className="sr-only focus:not-sr-only focus:absolute focus:left-2 focus:top-2 focus:z-50 focus:bg-paper-raised focus:p-2">
        Skip to content
      </a>
      <header className="border-b border-line bg-paper-raised">
        <div className="mx-auto flex max-w-7xl items-center gap-3 px-4 py-2">
          <NavLink to={paths.home} className="focus-ring flex items-center gap-2 rounded-control font-semibold text-ink">
            <img src="/favicon.svg" alt="" className="h-7 w-7" />
            <span className="hidden sm:inline">Pullbook</span>
            <span className="text-ink-subtle">·</span>
            <ShopName />
          </NavLink>
          <button
            type="button"
            className="focus-ring ml-auto min-h-touch rounded-control px-3 text-sm md:hidden"
            aria-expanded={menuOpen}
            aria-controls="main-nav"
            onClick={() => setMenuOpen((o) => !o)}
          >
            Menu
          </button>
          <div className="ml-auto hidden items-center gap-3 md:flex">
            <NavLink to={paths.account} className="focus-ring rounded-control text-sm text-ink-muted hover:text-ink">
              {user.name} <span className="text-ink-subtle">({ROLE_LABELS[user.role]})</span>
            </NavLink>
            <Button
              variant="ghost"
              size="sm"
              onClick={async () => {
                await signOut();
                navigate(paths.login);
              }}
            >
              Sign out
            </Button>
          </div>
        </div>
        <nav id="main-nav" aria-label="Main" className={cn('mx-auto max-w-7xl px-4 pb-2', menuOpen ? 'block' : 'hidden md:block')}>
          <ul className="flex flex-col gap-1 md:flex-row md:flex-wrap">
            {items.map((n) => (
              <li key={n.label}>
                <NavLink to={n.to} end={n.to === paths.home} className={linkClass} onClick={() => setMenuOpen(false)}>
                  {n.label}
                </NavLink>
              </li>
            ))}
            {admin.length > 0 && <li aria-hidden className="hidden w-px self-stretch bg-line md:block" />}
            {admin.map((n) => (
              <li key={n.label}>
                <NavLink to={n.to} className={linkClass} onClick={() => setMenuOpen(false)}>
                  {n.label}
                </NavLink>
              </li>
            ))}
            <li className="md:hidden">
              <NavLink to={paths.account} className={linkClass}>
                My account
              </NavLink>
            </li>
            <li className="md:hidden">
              <button
                type="button"
                className="focus-ring min-h-touch px-3 text-sm text-ink-muted"
                onClick={async () => {
                  await signOut();
                  navigate(paths.login);
                }}
              >
                Sign out
              </button>
            </li>
          </ul>
        </nav>
      </header>
      <main id="main" className="mx-auto max-w-7xl px-4 py-6">
        <Outlet />
      </main>
    </div>
  );
}
