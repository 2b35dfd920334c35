import { Link, useNavigate, useSearchParams } from 'react-router';
import { AuthFrame } from '../../components/auth-frame.tsx';
import { ResetPasswordForm } from '../../features/auth/components/reset-password-form.tsx';
import { paths } from '../paths.ts';

export default function ResetPasswordRoute() {
  const [params] = useSearchParams();
  const navigate = useNavigate();
  const token = params.get('token');
  return (
    <AuthFrame title="Choose a new password">
      {token ? (
        <ResetPasswordForm token={token} onDone={() => void navigate(`${paths.signIn.getHref()}?reset=done`, { replace: true })} />
      ) : (
        <p role="alert" className="rounded-xl bg-ember-soft px-3 py-2 text-ember">
          This link has no reset code in it. Open the link from the e-mail again, or ask for a new one.
        </p>
      )}
      <p className="mt-4 text-center">
        <Link to={paths.forgotPassword.getHref()} className="inline-flex min-h-12 items-center text-crust underline underline-offset-4">
          Ask for a new link
        </Link>
      </p>
    </AuthFrame>
  );
}
