import { useQueryClient } from '@tanstack/react-query';
import { Link, useNavigate, useSearchParams } from 'react-router-dom';
import { acceptInvitationBodySchema } from '#shared/schemas/banks';
import { NarrowPage } from '#src/components/layout/narrow-page';
import { Button, buttonStyles } from '#src/components/ui/button';
import { FormAlert } from '#src/components/ui/form-alert';
import { Loading } from '#src/components/ui/spinner';
import { paths } from '#src/config/paths';
import { useMe } from '#src/features/auth/api/get-me';
import { authKeys } from '#src/features/auth/api/keys';
import { useResendVerification } from '#src/features/auth/api/verify-email';
import { useAcceptInvitation } from '#src/features/banks/api/accept-invitation';
import { isApiError } from '#src/lib/api-client';
import type { BankNoticeState } from '../banks/bank-layout';

/**
 * Where an invitation e-mail's link lands. Signed out: sign in or create an account, then come
 * back here. Signed in: one press joins the bank and opens it.
 */
export function AcceptInvitationPage() {
  const [searchParams] = useSearchParams();
  const token = searchParams.get('token') ?? '';
  const here = paths.acceptInvitation.getHref(token);
  const me = useMe();
  const queryClient = useQueryClient();
  const navigate = useNavigate();
  const resendVerification = useResendVerification();
  const accept = useAcceptInvitation({
    onSuccess: async (joined) => {
      // The new membership must be in the bank switcher before the bank opens.
      await queryClient.invalidateQueries({ queryKey: authKeys.me(), refetchType: 'all' });
      const state: BankNoticeState = {
        notice: `Welcome to ${joined.bankName}. You joined as ${joined.role}.`,
      };
      await navigate(paths.overview.getHref(joined.bankId), { replace: true, state });
    },
  });

  const tokenLooksRight = acceptInvitationBodySchema.shape.token.safeParse(token).success;
  const signedOut = me.isError && isApiError(me.error) && me.error.status === 401;

  let body;
  if (!tokenLooksRight) {
    body = (
      <FormAlert>
        This invitation link is incomplete. Open the link from the e-mail again, or ask the bank’s owner to
        send a new invitation.
      </FormAlert>
    );
  } else if (me.isPending) {
    body = <Loading label="Checking who is signed in" />;
  } else if (signedOut) {
    body = (
      <div className="grid gap-3">
        <p className="text-loam-800">
          To join, sign in to your Hilum account — or create one, it takes a minute. You come straight back
          here afterwards to accept.
        </p>
        <Link to={paths.signIn.getHref(here)} className={buttonStyles({ size: 'lg', fullWidth: true })}>
          Sign in to accept
        </Link>
        <Link
          to={paths.signUp.getHref(here)}
          className={buttonStyles({ variant: 'secondary', size: 'lg', fullWidth: true })}
        >
          Create an account
        </Link>
      </div>
    );
  } else if (me.isError) {
    body = <FormAlert>{me.error.message}</FormAlert>;
  } else {
    const refused = accept.error;
    body = (
      <div className="grid gap-4">
        <p className="text-loam-800">
          You are signed in as <span className="font-semibold">{me.data.user.name}</span>{' '}
          <span className="break-all text-loam-600">({me.data.user.email})</span>. To accept with another
          account, sign out first from the account menu.
        </p>
        {refused ? (
          <FormAlert
            title={isApiError(refused) && refused.code === 'already_member' ? 'Already in' : undefined}
          >
            {refused.message}
          </FormAlert>
        ) : null}
        {refused && isApiError(refused) && refused.code === 'email_unverified' ? (
          resendVerification.isSuccess ? (
            <FormAlert tone="info">
              A confirmation link is on its way to {me.data.user.email}. Open it, then come back here.
            </FormAlert>
          ) : (
            <Button
              variant="secondary"
              size="lg"
              fullWidth
              isLoading={resendVerification.isPending}
              onClick={() => resendVerification.mutate()}
            >
              Send me the confirmation link
            </Button>
          )
        ) : null}
        {refused &&
        isApiError(refused) &&
        (refused.code === 'already_member' || refused.code === 'invalid_token') ? (
          <Link
            to={paths.home.getHref()}
            className={buttonStyles({ variant: 'secondary', size: 'lg', fullWidth: true })}
          >
            Go to my banks
          </Link>
        ) : (
          <Button size="lg" fullWidth isLoading={accept.isPending} onClick={() => accept.mutate(token)}>
            {accept.isPending ? 'Joining…' : 'Accept and open the bank'}
          </Button>
        )}
      </div>
    );
  }

  return (
    <NarrowPage
      title="You are invited to a seed bank"
      description="Someone who keeps a seed bank on Hilum asked you to share it. The e-mail named the bank and your role."
    >
      {body}
    </NarrowPage>
  );
}
