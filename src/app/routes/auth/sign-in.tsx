import { Link, useNavigate, useSearchParams } from 'react-router-dom';
import { NarrowPage } from '#src/components/layout/narrow-page';
import { paths } from '#src/config/paths';
import { DemoAccounts } from '#src/features/auth/components/demo-accounts';
import { SignInForm } from '#src/features/auth/components/sign-in-form';
import { isNonProduction, useHealth } from '#src/features/health/api/get-health';
import { safeNext } from '#src/lib/safe-next';
import { SignInNotice } from './sign-in-notice';

export function SignInPage() {
  const [searchParams] = useSearchParams();
  const next = searchParams.get('next');
  const navigate = useNavigate();
  const keepNext = next ? safeNext(next, '') || undefined : undefined;
  // The demo circle's sign-ins, on a development server only (the server says which it is).
  const showDemo = isNonProduction(useHealth().data);
  const onSignedIn = () => void navigate(safeNext(next), { replace: true });

  return (
    <NarrowPage
      title="Sign in"
      description="Back to your seed bank: lots, tests and this season’s sowings."
      notice={<SignInNotice next={keepNext ?? null} />}
      footer={
        <>
          <p>
            New to Hilum?{' '}
            <Link to={paths.signUp.getHref(keepNext)} className="font-semibold text-moss-800 underline">
              Create an account
            </Link>
          </p>
          {showDemo ? <DemoAccounts onSignedIn={onSignedIn} /> : null}
        </>
      }
    >
      <SignInForm onSignedIn={onSignedIn} />
    </NarrowPage>
  );
}
