import { Link, useNavigate, useSearchParams } from 'react-router-dom';
import { passwordResetConfirmBodySchema } from '#shared/schemas/accounts';
import { NarrowPage } from '#src/components/layout/narrow-page';
import { buttonStyles } from '#src/components/ui/button';
import { FormAlert } from '#src/components/ui/form-alert';
import { paths } from '#src/config/paths';
import { ResetPasswordForm } from '#src/features/auth/components/reset-password-form';
import type { SignInState } from '#src/app/session';

export function ResetPasswordPage() {
  const [searchParams] = useSearchParams();
  const token = searchParams.get('token') ?? '';
  const navigate = useNavigate();
  const tokenLooksRight = passwordResetConfirmBodySchema.shape.token.safeParse(token).success;

  return (
    <NarrowPage
      title="Choose a new password"
      description="Pick one you have not used here before. Afterwards you sign in again on every device."
      footer={
        tokenLooksRight ? (
          <p>
            Link expired or already used?{' '}
            <Link to={paths.forgotPassword.getHref()} className="font-semibold text-moss-800 underline">
              Ask for a new one
            </Link>
          </p>
        ) : undefined
      }
    >
      {tokenLooksRight ? (
        <ResetPasswordForm
          token={token}
          onDone={() =>
            void navigate(paths.signIn.getHref(), {
              replace: true,
              state: { reason: 'password-changed' } satisfies SignInState,
            })
          }
        />
      ) : (
        <div className="grid gap-4">
          <FormAlert>
            This link is incomplete. Open the link from the e-mail again, or ask for a new one.
          </FormAlert>
          <Link to={paths.forgotPassword.getHref()} className={buttonStyles({ variant: 'secondary' })}>
            Ask for a new link
          </Link>
        </div>
      )}
    </NarrowPage>
  );
}
