import { useQueryClient } from '@tanstack/react-query';
import { useCallback, useState } from 'react';
import { Outlet, ScrollRestoration, useMatches, useNavigate, useNavigation } from 'react-router-dom';
import { AppShell } from '#src/components/layout/app-shell';
import { WriteQueueStatus } from '#src/components/layout/write-queue-status';
import { paths } from '#src/config/paths';
import { useMe } from '#src/features/auth/api/get-me';
import { useLogout } from '#src/features/auth/api/logout';
import { useResendVerification } from '#src/features/auth/api/verify-email';
import { isNonProduction, useHealth } from '#src/features/health/api/get-health';
import { ScanButton } from '#src/features/scan/components/scan-button';
import { bankKeys } from '#src/lib/bank-api';
import { useQueuedWrites, useWriteQueueSender, type QueuedWrite } from '#src/lib/write-queue';
import type { SignInState } from '../session';

/** The bank whose pages are open, from the deepest route that names one. */
function useCurrentBankId(): string | undefined {
  const matches = useMatches();
  for (let i = matches.length - 1; i >= 0; i -= 1) {
    const bankId = matches[i]?.params.bankId;
    if (bankId) return bankId;
  }
  return undefined;
}

/** The root layout: the shell around every page, with the person's banks and account menu. */
export function RootLayout() {
  const health = useHealth();
  const me = useMe();
  const navigation = useNavigation();
  const navigate = useNavigate();
  const logout = useLogout();
  const resendVerification = useResendVerification();
  const [signingOut, setSigningOut] = useState<'here' | 'everywhere'>();
  const showDevLinks = import.meta.env.DEV || isNonProduction(health.data);
  const currentBankId = useCurrentBankId();
  const user = me.data?.user;
  const inBank = currentBankId !== undefined && me.data?.memberships.some((m) => m.bankId === currentBankId);
  const queryClient = useQueryClient();
  // A write the queue sent later changed the bank: what is on screen of it is read again.
  const onSent = useCallback(
    (write: QueuedWrite) => void queryClient.invalidateQueries({ queryKey: bankKeys.bank(write.bankId) }),
    [queryClient],
  );
  useWriteQueueSender(user?.id, onSent);
  const waiting = useQueuedWrites().length;

  const signOut = async (everywhere: boolean) => {
    if (
      waiting > 0 &&
      !window.confirm(
        `${waiting === 1 ? 'One entry has' : `${waiting} entries have`} not reached the server yet. Signing out deletes ${waiting === 1 ? 'it' : 'them'} from this device. Sign out anyway?`,
      )
    )
      return;
    setSigningOut(everywhere ? 'everywhere' : 'here');
    try {
      await logout.mutateAsync({ everywhere });
      const state: SignInState = { reason: 'signed-out' };
      await navigate(paths.signIn.getHref(), { replace: true, state });
    } catch {
      // The menu shows the failure; the person stays signed in.
    } finally {
      setSigningOut(undefined);
    }
  };

  return (
    <AppShell
      showDevLinks={showDevLinks}
      isNavigating={navigation.state === 'loading'}
      account={{
        user,
        onSignOut: (everywhere) => void signOut(everywhere),
        signingOut,
        signOutError: logout.error?.message,
        verification: {
          onResend: () => resendVerification.mutate(),
          sending: resendVerification.isPending,
          sent: resendVerification.isSuccess,
          error: resendVerification.error?.message,
        },
      }}
      banks={user ? me.data?.memberships : undefined}
      currentBankId={inBank ? currentBankId : undefined}
      tools={
        user ? (
          <>
            <WriteQueueStatus />
            {inBank ? <ScanButton /> : null}
          </>
        ) : null
      }
    >
      <Outlet />
      <ScrollRestoration />
    </AppShell>
  );
}
