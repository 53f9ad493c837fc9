import { useId } from 'react';
import { Link, useLocation } from 'react-router-dom';
import { paths } from '#src/config/paths';
import { cn } from '#src/lib/cn';
import { buttonStyles, Button } from '../ui/button';
import { AccountIcon, ChevronDownIcon } from './icons';
import { useDisclosure } from './use-disclosure';

export interface AccountMenuUser {
  name: string;
  email: string;
  /** Whether the address was confirmed by the mailed link. */
  emailVerified?: boolean;
}

/** Asking for a new confirmation link, for an account whose address is not confirmed yet. */
export interface AccountMenuVerification {
  onResend: () => void;
  sending: boolean;
  sent: boolean;
  error?: string | undefined;
}

export interface AccountMenuProps {
  /** The signed-in person, or undefined when nobody is signed in. */
  user: AccountMenuUser | undefined;
  onSignOut: (everywhere: boolean) => void;
  /** Which sign-out is under way, to show it on its button. */
  signingOut?: 'here' | 'everywhere' | undefined;
  signOutError?: string | undefined;
  /** Account → Reminders for the bank whose pages are open; left out outside a bank. */
  remindersHref?: string | undefined;
  verification?: AccountMenuVerification | undefined;
}

/** The person's name and e-mail with the two ways to sign out; sign-in links when signed out. */
export function AccountMenu({
  user,
  onSignOut,
  signingOut,
  signOutError,
  remindersHref,
  verification,
}: AccountMenuProps) {
  const { open, setOpen, rootRef, buttonRef } = useDisclosure();
  const panelId = useId();
  const location = useLocation();
  const onAuthPage = location.pathname === paths.signIn.path || location.pathname === paths.signUp.path;

  if (!user) {
    if (onAuthPage) return null;
    // Come back to this page afterwards (an invitation waiting to be accepted, say).
    const noReturn: readonly string[] = [
      paths.home.path,
      paths.forgotPassword.path,
      paths.resetPassword.path,
    ];
    const staysPut = noReturn.includes(location.pathname);
    const here = staysPut ? undefined : location.pathname + location.search;
    return (
      <Link to={paths.signIn.getHref(here)} className={buttonStyles({ variant: 'secondary' })}>
        Sign in
      </Link>
    );
  }

  return (
    <div ref={rootRef} className="relative">
      <button
        ref={buttonRef}
        type="button"
        aria-expanded={open}
        aria-controls={panelId}
        onClick={() => setOpen(!open)}
        className={cn(
          'inline-flex min-h-11 min-w-11 items-center justify-center gap-1 rounded-lg px-2 text-loam-800',
          'hover:bg-husk-200 active:bg-husk-300',
          open && 'bg-husk-200',
        )}
      >
        <AccountIcon />
        <span className="sr-only lg:not-sr-only lg:max-w-40 lg:truncate lg:font-semibold">Account</span>
        <ChevronDownIcon />
      </button>
      <div
        id={panelId}
        hidden={!open}
        className="absolute right-0 z-30 mt-2 w-72 max-w-[calc(100vw-1.5rem)] rounded-xl border border-loam-200 bg-white p-4 shadow-lg shadow-loam-900/10"
      >
        <p className="text-sm text-loam-600">Signed in as</p>
        <p className="font-semibold text-loam-900">{user.name}</p>
        <p className="break-all text-sm text-loam-700">{user.email}</p>
        {user.emailVerified === true ? (
          <p className="mt-1 text-sm text-moss-800">Address confirmed</p>
        ) : user.emailVerified === false ? (
          <div className="mt-2 grid gap-2 rounded-lg border border-seedcoat-300 bg-seedcoat-100 p-3 text-sm text-seedcoat-800">
            <p>
              <span className="font-semibold">Address not confirmed yet.</span> Open the link we mailed you.
              Until then nobody can make you an owner of their bank.
            </p>
            {verification ? (
              verification.sent ? (
                <p role="status" className="font-semibold">
                  A new link is on its way to {user.email}.
                </p>
              ) : (
                <Button
                  variant="secondary"
                  fullWidth
                  isLoading={verification.sending}
                  onClick={verification.onResend}
                >
                  Send the link again
                </Button>
              )
            ) : null}
            {verification?.error ? (
              <p role="alert" className="font-semibold text-clay-700">
                {verification.error}
              </p>
            ) : null}
          </div>
        ) : null}
        {signOutError ? (
          <p role="alert" className="mt-3 text-sm font-semibold text-clay-700">
            {signOutError}
          </p>
        ) : null}
        <div className="mt-4 grid gap-2">
          {remindersHref ? (
            <Link
              to={remindersHref}
              onClick={() => setOpen(false)}
              className={buttonStyles({ variant: 'secondary', fullWidth: true })}
            >
              Reminders
            </Link>
          ) : null}
          <Button
            variant="secondary"
            fullWidth
            isLoading={signingOut === 'here'}
            disabled={signingOut !== undefined}
            onClick={() => onSignOut(false)}
          >
            Sign out
          </Button>
          <Button
            variant="quiet"
            fullWidth
            isLoading={signingOut === 'everywhere'}
            disabled={signingOut !== undefined}
            onClick={() => onSignOut(true)}
          >
            Sign out on every device
          </Button>
        </div>
      </div>
    </div>
  );
}
