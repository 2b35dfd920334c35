import { useNavigate, useSearchParams } from 'react-router';
import { AuthFrame } from '../../components/auth-frame.tsx';
import { SignInForm } from '../../features/auth/components/sign-in-form.tsx';
import { safeNext } from '../loaders.ts';
import { paths } from '../paths.ts';

export default function SignInRoute() {
  const [params] = useSearchParams();
  const navigate = useNavigate();
  const reset = params.get('reset') === 'done';
  return (
    <AuthFrame title="Sign in">
      {reset && (
        <p role="status" className="mb-4 rounded-xl bg-sage-soft px-3 py-2 text-sage">
          Your new password is set. Sign in with it.
        </p>
      )}
      <SignInForm forgotHref={paths.forgotPassword.getHref()} onSignedIn={() => void navigate(safeNext(params.get('next')), { replace: true })} />
    </AuthFrame>
  );
}
