import type { QueryClient } from '@tanstack/react-query';
import { redirect, useNavigate, useSearchParams, type LoaderFunctionArgs } from 'react-router';
import { AuthFrame } from '../../components/auth-frame.tsx';
import { getMeQueryOptions } from '../../features/auth/api/get-me.ts';
import { SignInForm } from '../../features/auth/components/sign-in-form.tsx';
import { paths } from '../paths.ts';

/** Only a path inside the viewer may be a place to come back to. */
function safeNext(next: string | null): string {
  return next && next.startsWith('/') && !next.startsWith('//') ? next : paths.formulas.getHref();
}

export const clientLoader = (queryClient: QueryClient) => async ({ request }: LoaderFunctionArgs) => {
  // Already signed in: go on to where the person was heading.
  const me = await queryClient.fetchQuery(getMeQueryOptions()).catch(() => null);
  if (me) throw redirect(safeNext(new URL(request.url).searchParams.get('next')));
  return null;
};

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
