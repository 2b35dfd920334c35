import type { ReactNode } from 'react';
import { Link, useNavigate, useSearchParams } from 'react-router';
import { AuthFrame } from '../../components/auth-frame.tsx';
import { useResetLink } from '../../features/auth/api/check-reset-link.ts';
import { ResetPasswordForm } from '../../features/auth/components/reset-password-form.tsx';
import { Loading } from '../../components/spinner.tsx';
import { getErrorMessage } from '../../lib/errors.ts';
import { paths } from '../paths.ts';

/** The form only for a link that still works; a spent or expired one is said as the page opens. */
function CheckedLink({ token, children }: { token: string; children: ReactNode }) {
  const link = useResetLink(token);
  if (link.isPending) return <Loading label="Checking the link…" />;
  if (link.isError) {
    const message = getErrorMessage(link.error);
    return (
      <p role="alert" className="rounded-xl bg-ember-soft px-3 py-2 text-ember" data-testid="reset-link-problem">
        {message[0].toUpperCase() + message.slice(1)}.
      </p>
    );
  }
  return <>{children}</>;
}

export default function ResetPasswordRoute() {
  const [params] = useSearchParams();
  const navigate = useNavigate();
  const token = params.get('token');
  return (
    <AuthFrame title="Choose a new password">
      {token ? (
        <CheckedLink token={token}>
          <ResetPasswordForm token={token} onDone={() => void navigate(`${paths.signIn.getHref()}?reset=done`, { replace: true })} />
        </CheckedLink>
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
