import { useLocation } from 'react-router-dom';
import { FormAlert } from '#src/components/ui/form-alert';
import type { SignInState } from '#src/app/session';

const messages = {
  'session-ended':
    'Your session ended — perhaps you signed out on another device. Sign in again to carry on.',
  'signed-out': 'You are signed out.',
  'password-changed':
    'Your new password is saved and every device was signed out. Sign in with the new password.',
} as const;

/** Why the person landed on the sign-in page, when another page sent them here. */
export function SignInNotice({ next }: { next: string | null }) {
  const state = useLocation().state as SignInState | null;
  const reason = state?.reason;
  if (reason) {
    return <FormAlert tone={reason === 'session-ended' ? 'info' : 'success'}>{messages[reason]}</FormAlert>;
  }
  if (next?.startsWith('/invitations/accept')) {
    return (
      <FormAlert tone="info">
        Sign in or create an account to accept your invitation. You will come straight back to it.
      </FormAlert>
    );
  }
  return null;
}
