import { Link, useNavigate, useSearchParams } from 'react-router-dom';
import { NarrowPage } from '#src/components/layout/narrow-page';
import { paths } from '#src/config/paths';
import { SignUpForm } from '#src/features/auth/components/sign-up-form';
import { safeNext } from '#src/lib/safe-next';
import { SignInNotice } from './sign-in-notice';

export function SignUpPage() {
  const [searchParams] = useSearchParams();
  const next = searchParams.get('next');
  const navigate = useNavigate();
  const keepNext = next ? safeNext(next, '') || undefined : undefined;

  return (
    <NarrowPage
      title="Create an account"
      description="Keep your own seed bank, or join the one your seed circle shares."
      notice={<SignInNotice next={keepNext ?? null} />}
      footer={
        <p>
          Already have an account?{' '}
          <Link to={paths.signIn.getHref(keepNext)} className="font-semibold text-moss-800 underline">
            Sign in
          </Link>
        </p>
      }
    >
      <SignUpForm onSignedUp={() => void navigate(safeNext(next), { replace: true })} />
    </NarrowPage>
  );
}
