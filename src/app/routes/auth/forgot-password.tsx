import { Link } from 'react-router-dom';
import { NarrowPage } from '#src/components/layout/narrow-page';
import { paths } from '#src/config/paths';
import { ForgotPasswordForm } from '#src/features/auth/components/forgot-password-form';

export function ForgotPasswordPage() {
  return (
    <NarrowPage
      title="Forgot your password?"
      description="Give the e-mail address you signed up with. If it belongs to an account, we send it a link to choose a new password."
      footer={
        <p>
          Remembered it?{' '}
          <Link to={paths.signIn.getHref()} className="font-semibold text-moss-800 underline">
            Back to sign in
          </Link>
        </p>
      }
    >
      <ForgotPasswordForm />
    </NarrowPage>
  );
}
