import { Link, useNavigate, useSearchParams } from 'react-router-dom';
import { NarrowPage } from '../../../components/layout/narrow-page';
import { paths } from '../../../config/paths';
import { SignInForm } from '../../../features/auth/components/sign-in-form';
import { safeNext } from '../../../lib/safe-next';
import { SignInNotice } from './sign-in-notice';

export function SignInPage() {
  const [searchParams] = useSearchParams();
  const next = searchParams.get('next');
  const navigate = useNavigate();
  const keepNext = next ? safeNext(next, '') || undefined : undefined;

  return (
    <NarrowPage
      title="Sign in"
      description="Back to your seed bank: lots, tests and this season’s sowings."
      notice={<SignInNotice next={keepNext ?? null} />}
      footer={
        <p>
          New to Hilum?{' '}
          <Link to={paths.signUp.getHref(keepNext)} className="font-semibold text-moss-800 underline">
            Create an account
          </Link>
        </p>
      }
    >
      <SignInForm onSignedIn={() => void navigate(safeNext(next), { replace: true })} />
    </NarrowPage>
  );
}
