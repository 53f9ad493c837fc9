import type { ReactNode } from 'react';
import { Link, NavLink } from 'react-router-dom';
import { paths } from '#src/config/paths';
import { cn } from '#src/lib/cn';
import { AccountMenu, type AccountMenuProps } from './account-menu';
import { BankSwitcher, type SwitcherBank } from './bank-switcher';
import { HilumMark } from './hilum-mark';
import { MailIcon } from './icons';
import { bankNavItems } from './nav-items';

export interface AppShellProps {
  children: ReactNode;
  /** Show the link to the development mailbox (never in production). */
  showDevLinks?: boolean;
  /** Shows a thin progress bar under the header while a route is loading. */
  isNavigating?: boolean;
  /** The signed-in person and their sign-out actions for the account menu. */
  account: AccountMenuProps;
  /** The person's banks for the switcher; undefined when nobody is signed in. */
  banks?: readonly SwitcherBank[] | undefined;
  /** The bank whose pages are open; its sections fill the navigation. */
  currentBankId?: string | undefined;
  /** Small tools beside the account menu (what waits to send, scanning a packet). */
  tools?: ReactNode;
}

/**
 * The frame around every page: header with the mark, the bank switcher, the bank's sections and the
 * account menu. From 1024 px the sections sit in the header; below that they move to a bar at the
 * bottom, in reach of a thumb. Outside a bank (signing in, starting a bank) there are no sections.
 */
export function AppShell({
  children,
  showDevLinks = false,
  isNavigating = false,
  account,
  banks,
  currentBankId,
  tools,
}: AppShellProps) {
  const navItems = currentBankId ? bankNavItems(currentBankId) : [];
  const hasNav = navItems.length > 0;
  const hasSwitcher = banks !== undefined && banks.length > 0;
  return (
    <div className="flex min-h-dvh flex-col">
      <a
        href="#main"
        className="sr-only focus:not-sr-only focus:fixed focus:left-3 focus:top-3 focus:z-50 focus:rounded-lg focus:bg-white focus:px-4 focus:py-3 focus:font-semibold focus:text-moss-800 focus:shadow-lg"
      >
        Skip to content
      </a>

      <header className="sticky top-0 z-20 border-b border-husk-300 bg-husk-100/95 backdrop-blur supports-[backdrop-filter]:bg-husk-100/85">
        <div className="mx-auto flex h-16 max-w-6xl items-center gap-2 px-3 sm:gap-4 sm:px-6">
          <Link
            to={paths.home.getHref()}
            className="-ml-1 inline-flex min-h-11 shrink-0 items-center gap-2 rounded-lg px-1"
            aria-label="Hilum, start page"
          >
            <HilumMark className="size-9" />
            <span
              className={cn(
                'text-2xl font-bold tracking-tight text-loam-950',
                hasSwitcher && 'hidden sm:inline',
              )}
            >
              Hilum
            </span>
          </Link>

          {hasSwitcher ? <BankSwitcher banks={banks} currentBankId={currentBankId} /> : null}

          <nav aria-label="Bank" className={cn('hidden', hasNav && 'lg:block')}>
            <ul className="flex items-center gap-1">
              {navItems.map((item) => (
                <li key={item.area}>
                  <NavLink
                    to={item.href}
                    className={({ isActive }) =>
                      cn(
                        'inline-flex min-h-11 items-center rounded-lg px-3 font-semibold',
                        isActive
                          ? 'bg-moss-700 text-white'
                          : 'text-loam-800 hover:bg-husk-200 hover:text-loam-950',
                      )
                    }
                  >
                    {item.label}
                  </NavLink>
                </li>
              ))}
            </ul>
          </nav>

          <div className="ml-auto flex shrink-0 items-center gap-1">
            {showDevLinks ? (
              <NavLink
                to={paths.devMail.getHref()}
                className={({ isActive }) =>
                  cn(
                    'inline-flex min-h-11 items-center gap-1.5 rounded-lg border border-dashed px-2.5 text-sm font-semibold',
                    isActive
                      ? 'border-frost-700 bg-frost-100 text-frost-800'
                      : 'border-frost-400 text-frost-700 hover:bg-frost-50',
                  )
                }
              >
                <MailIcon />
                <span className="sr-only sm:not-sr-only">Dev mail</span>
                <span className="sr-only"> (development mailbox)</span>
              </NavLink>
            ) : null}
            {tools}
            <AccountMenu
              {...account}
              remindersHref={currentBankId ? paths.reminders.getHref(currentBankId) : undefined}
            />
          </div>
        </div>
      </header>

      <div
        aria-hidden="true"
        className={cn(
          'pointer-events-none fixed inset-x-0 top-16 z-20 h-0.5 origin-left bg-seedcoat-500 transition-transform duration-500',
          isNavigating ? 'scale-x-75' : 'scale-x-0',
        )}
      />

      <main
        id="main"
        tabIndex={-1}
        className={cn(
          'mx-auto w-full max-w-6xl flex-1 px-4 pt-6 outline-none sm:px-6',
          hasNav ? 'pb-28 lg:pb-12' : 'pb-12',
        )}
      >
        {children}
      </main>

      {hasNav ? (
        <nav
          aria-label="Bank"
          className="fixed inset-x-0 bottom-0 z-20 border-t border-husk-300 bg-husk-100 pb-[env(safe-area-inset-bottom)] lg:hidden"
        >
          <ul className="grid grid-cols-5">
            {navItems.map((item) => (
              <li key={item.area}>
                <NavLink
                  to={item.href}
                  className={({ isActive }) =>
                    cn(
                      'flex min-h-16 flex-col items-center justify-center gap-0.5 px-1 text-xs font-semibold',
                      isActive ? 'text-moss-800' : 'text-loam-700 active:bg-husk-200',
                    )
                  }
                >
                  {({ isActive }) => (
                    <>
                      <span
                        className={cn(
                          'inline-flex h-8 w-12 items-center justify-center rounded-full',
                          isActive && 'bg-moss-100',
                        )}
                      >
                        {item.icon}
                      </span>
                      {item.label}
                    </>
                  )}
                </NavLink>
              </li>
            ))}
          </ul>
        </nav>
      ) : null}
    </div>
  );
}
