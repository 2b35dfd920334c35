// The signed-in frame: the header with the places a role may go, and the page below it.
import { NavLink, Outlet, useNavigation } from 'react-router';
import type { Permission } from '#shared/permissions';
import { useEffect } from 'react';
import { Logo } from '../components/logo.tsx';
import { setDeviceUnitSystem } from '../lib/units.ts';
import { useMe } from '../features/auth/api/get-me.ts';
import { useOutbox, useOutboxSender } from '../features/records/use-outbox.ts';
import { paths } from './paths.ts';

const shortRole: Record<string, string> = { bench: 'Bench', reviewer: 'Head baker', author: 'Technical baker', admin: 'Owner' };

export function AppShell() {
  const me = useMe().data;
  const navigation = useNavigation();
  // The account's units win over this device's memory of them, so every device follows the person.
  const accountUnits = me?.unitSystem;
  useEffect(() => {
    if (accountUnits) setDeviceUnitSystem(accountUnits);
  }, [accountUnits]);
  const can = (p: Permission) => me?.permissions.includes(p) ?? false;
  // Records kept on this tablet while offline are sent from any page once someone is signed in.
  useOutboxSender(me !== undefined);
  const waiting = useOutbox().items;
  const links = [
    { to: paths.formulas.getHref(), label: 'Formulas', show: true },
    { to: paths.plans.getHref(), label: 'Bake days', show: can('read:plan') },
    { to: paths.changes.getHref(), label: 'Changes', show: can('read:history') },
    { to: paths.accounts.getHref(), label: 'Accounts', show: can('manage:users') },
  ].filter((l) => l.show);

  return (
    <div className="min-h-dvh">
      <a
        href="#main"
        className="sr-only focus:not-sr-only focus:fixed focus:left-3 focus:top-3 focus:z-50 focus:rounded-xl focus:bg-card focus:p-3"
      >
        Skip to the page
      </a>
      <header className="sticky top-0 z-20 border-b-2 border-crust/30 bg-page/95 backdrop-blur print:hidden">
        <div className="mx-auto flex max-w-6xl flex-wrap items-center gap-x-4 gap-y-1 px-4 py-2">
          <NavLink to={paths.formulas.getHref()} className="flex min-h-12 items-center gap-2 rounded-xl pr-2" aria-label="Panform, home">
            <Logo />
            <span className="font-display text-2xl font-bold tracking-tight max-lg:sr-only">Panform</span>
          </NavLink>
          <nav aria-label="Main" className="flex flex-1 flex-wrap items-center gap-1 max-lg:gap-0">
            {links.map((l) => (
              <NavLink
                key={l.to}
                to={l.to}
                className={({ isActive }) =>
                  `flex min-h-12 items-center rounded-xl px-4 text-lg font-semibold max-lg:px-3 ${
                    isActive ? 'bg-crust text-on-crust' : 'text-ink hover:bg-sunk'
                  }`
                }
              >
                {l.label}
              </NavLink>
            ))}
          </nav>
          {waiting.length > 0 && (
            <NavLink
              to={paths.plan.getHref(waiting[0].date)}
              className="flex min-h-12 items-center gap-2 rounded-xl border-2 border-dashed border-honey bg-honey-soft px-3 font-semibold text-ink"
              data-testid="outbox-badge"
            >
              <span className="figure rounded-full bg-honey px-2 text-on-crust">{waiting.length}</span> waiting to send
            </NavLink>
          )}
          <NavLink
            to={paths.account.getHref()}
            className={({ isActive }) =>
              `flex min-h-12 items-center gap-2 rounded-xl px-3 ${isActive ? 'bg-crust text-on-crust' : 'hover:bg-sunk'}`
            }
          >
            <span
              aria-hidden="true"
              className="grid h-8 w-8 place-items-center rounded-full bg-crumb font-bold text-crust ring-2 ring-crust/40"
            >
              {(me?.user.name ?? '?').slice(0, 1).toUpperCase()}
            </span>
            <span className="text-left leading-tight">
              <span className="block font-semibold">{me?.user.name ?? 'Account'}</span>
              <span className="block text-sm opacity-80">{me ? (shortRole[me.user.role] ?? me.user.role) : ''}</span>
            </span>
          </NavLink>
        </div>
        <div
          aria-hidden="true"
          className={`h-1 origin-left bg-crust transition-transform duration-300 ${navigation.state === 'loading' ? 'scale-x-75' : 'scale-x-0'}`}
        />
      </header>
      <main id="main" tabIndex={-1} className="mx-auto max-w-6xl px-4 py-5 outline-none print:max-w-none print:p-0">
        <Outlet />
      </main>
    </div>
  );
}
