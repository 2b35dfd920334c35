import { Link } from 'react-router';
import { AuthFrame } from '../../components/auth-frame.tsx';
import { ResetRequestForm } from '../../features/auth/components/reset-request-form.tsx';
import { paths } from '../paths.ts';

export default function ForgotPasswordRoute() {
  return (
    <AuthFrame title="New password">
      <ResetRequestForm />
      <p className="mt-4 text-center">
        <Link to={paths.signIn.getHref()} className="inline-flex min-h-12 items-center text-crust underline underline-offset-4">
          Back to sign in
        </Link>
      </p>
    </AuthFrame>
  );
}
