import { Link, useSearchParams } from 'react-router-dom';
import { verifyEmailBodySchema } from '#shared/schemas/accounts';
import { NarrowPage } from '#src/components/layout/narrow-page';
import { Button, buttonStyles } from '#src/components/ui/button';
import { FormAlert } from '#src/components/ui/form-alert';
import { paths } from '#src/config/paths';
import { useVerifyEmail } from '#src/features/auth/api/verify-email';

/**
 * Where the confirmation mail's link lands. Confirming takes one press, not the page load, so a mail
 * program that opens links to check them does not confirm anything by itself.
 */
export function VerifyEmailPage() {
  const [searchParams] = useSearchParams();
  const token = searchParams.get('token') ?? '';
  const verify = useVerifyEmail();
  const tokenLooksRight = verifyEmailBodySchema.shape.token.safeParse(token).success;

  let body;
  if (!tokenLooksRight) {
    body = (
      <FormAlert>
        This confirmation link is incomplete. Open the link from the e-mail again, or sign in and ask for a
        new one from the account menu.
      </FormAlert>
    );
  } else if (verify.isSuccess) {
    body = (
      <div className="grid gap-4">
        <FormAlert tone="success" title="Address confirmed">
          {verify.data.email} is confirmed for your Hilum account.
        </FormAlert>
        <Link to={paths.home.getHref()} className={buttonStyles({ size: 'lg', fullWidth: true })}>
          Go to Hilum
        </Link>
      </div>
    );
  } else {
    body = (
      <div className="grid gap-4">
        {verify.error ? <FormAlert>{verify.error.message}</FormAlert> : null}
        <Button size="lg" fullWidth isLoading={verify.isPending} onClick={() => verify.mutate(token)}>
          Confirm my e-mail address
        </Button>
      </div>
    );
  }

  return (
    <NarrowPage
      title="Confirm your e-mail address"
      description="A confirmed address lets a seed bank’s owner make you an owner too."
    >
      {body}
    </NarrowPage>
  );
}
