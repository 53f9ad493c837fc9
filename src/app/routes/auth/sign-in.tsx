import { Link, useNavigate, useSearchParams } from 'react-router-dom';
import { NarrowPage } from '../../../components/layout/narrow-page';
import { paths } from '../../../config/paths';
import { DemoAccounts } from '../../../features/auth/components/demo-accounts';
import { SignInForm } from '../../../features/auth/components/sign-in-form';
import { isNonProduction, useHealth } from '../../../features/health/api/get-health';
import { safeNext } from '../../../lib/safe-next';
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
