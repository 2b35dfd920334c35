// Known HTTP statuses get their own page; everything else gets the message from getErrorMessage.
import type { ComponentType } from 'react';
import { isRouteErrorResponse, Link, useLocation } from 'react-router';
import { statusOf } from '../lib/api-client.ts';
import { getErrorMessage } from '../lib/errors.ts';
import { buttonClass } from './button.tsx';

function Plate({ code, title, children }: { code: string; title: string; children: React.ReactNode }) {
  return (
    <div className="mx-auto max-w-xl py-10 text-center">
      <title>{`${title} · Panform`}</title>
      <p className="font-mono text-6xl font-bold text-crust" aria-hidden="true">
        {code}
      </p>
      <h1 className="mt-3 text-3xl font-bold">{title}</h1>
      <div className="mt-4 space-y-4 text-lg text-muted">{children}</div>
    </div>
  );
}

export function NotFoundView() {
  return (
    <Plate code="404" title="Nothing on this shelf">
      <p>The page or formula you asked for is not here. It may have been renamed or taken out of the book.</p>
      <Link to="/formulas" className={buttonClass('primary')}>
        Back to the formulas
      </Link>
    </Plate>
  );
}

export function ForbiddenView() {
  return (
    <Plate code="403" title="Not for your role">
      <p>Your account cannot open this page. Ask the head baker or the owner if you need it.</p>
      <Link to="/formulas" className={buttonClass('primary')}>
        Back to the formulas
      </Link>
    </Plate>
  );
}

export function SignedOutView() {
  const location = useLocation();
  const next = location.pathname + location.search;
  return (
    <Plate code="401" title="Signed out">
      <p>Your session has ended. Sign in again to carry on.</p>
      <Link to={`/sign-in?next=${encodeURIComponent(next)}`} className={buttonClass('primary')}>
        Sign in
      </Link>
    </Plate>
  );
}

export function TooManyView() {
  return (
    <Plate code="429" title="Slow down a moment">
      <p>Too many tries in a short time. Wait a minute, then try again.</p>
    </Plate>
  );
}

export const statusViews: Record<number, ComponentType> = {
  401: SignedOutView,
  403: ForbiddenView,
  404: NotFoundView,
  429: TooManyView,
};

export function GenericErrorView({ error, onRetry }: { error: unknown; onRetry?: () => void }) {
  return (
    <div role="alert" className="mx-auto max-w-xl py-10 text-center">
      <h1 className="text-3xl font-bold">Something went wrong</h1>
      <p className="mt-3 text-lg text-muted">{getErrorMessage(error)}</p>
      <div className="mt-5 flex justify-center gap-3">
        {onRetry && (
          <button type="button" onClick={onRetry} className={buttonClass('primary')}>
            Try again
          </button>
        )}
        <a href="/formulas" className={buttonClass('plain')}>
          Back to the formulas
        </a>
      </div>
    </div>
  );
}

export function errorStatus(error: unknown): number | null {
  if (isRouteErrorResponse(error)) return error.status;
  return statusOf(error);
}

/** A whole-page error: a known status shows its page, anything else the message. */
export function ErrorView({ error, onRetry }: { error: unknown; onRetry?: () => void }) {
  const status = errorStatus(error);
  const View = status === null ? undefined : statusViews[status];
  if (View) return <View />;
  return <GenericErrorView error={error} onRetry={onRetry} />;
}
