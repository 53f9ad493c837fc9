import type { ReactNode } from 'react';
import { Link, NavLink } from 'react-router-dom';
import { paths } from '../../config/paths';
import { cn } from '../../lib/cn';
import { AccountMenu } from './account-menu';
import { HilumWordmark } from './hilum-mark';
import { MailIcon } from './icons';
import { navItems } from './nav-items';

export interface AppShellProps {
  children: ReactNode;
  /** Show the link to the development mailbox (never in production). */
  showDevLinks?: boolean;
  /** Shows a thin progress bar under the header while a route is loading. */
  isNavigating?: boolean;
}

/**
 * The frame around every page: header with the wordmark, the bank's sections and the account menu.
 * From 768 px the sections sit in the header; on a phone they move to a bar at the bottom, in reach
 * of a thumb.
 */
export function AppShell({ children, showDevLinks = false, isNavigating = false }: AppShellProps) {
  return (
    <div className="flex min-h-dvh flex-col">
      <a
        href="#main"
        className="sr-only focus:not-sr-only focus:fixed focus:left-3 focus:top-3 focus:z-50 focus:rounded-lg focus:bg-white focus:px-4 focus:py-3 focus:font-semibold focus:text-moss-800 focus:shadow-lg"
      >
        Skip to content
      </a>

      <header className="sticky top-0 z-20 border-b border-husk-300 bg-husk-100/95 backdrop-blur supports-[backdrop-filter]:bg-husk-100/85">
        <div className="mx-auto flex h-16 max-w-6xl items-center gap-4 px-3 sm:px-6">
          <Link
            to={paths.home.getHref()}
            className="-ml-1 inline-flex min-h-11 items-center rounded-lg px-1"
            aria-label="Hilum, start page"
          >
            <HilumWordmark />
          </Link>

          <nav aria-label="Bank" className="hidden md:block">
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

          <div className="ml-auto flex items-center gap-1">
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
                <span>
                  Dev mail<span className="sr-only"> (development mailbox)</span>
                </span>
              </NavLink>
            ) : null}
            <AccountMenu />
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
        className="mx-auto w-full max-w-6xl flex-1 px-4 pb-28 pt-6 outline-none sm:px-6 md:pb-12"
      >
        {children}
      </main>

      <nav
        aria-label="Bank"
        className="fixed inset-x-0 bottom-0 z-20 border-t border-husk-300 bg-husk-100 pb-[env(safe-area-inset-bottom)] md:hidden"
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
    </div>
  );
}
