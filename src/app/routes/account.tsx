import { Link } from 'react-router';
import { Button } from '../../components/button.tsx';
import { PageHeading, Panel } from '../../components/panel.tsx';
import { QueryState } from '../../components/query-state.tsx';
import { useMe } from '../../features/auth/api/get-me.ts';
import { useSignOut } from '../../features/auth/api/sign-out.ts';
import { UnitsSetting } from '../../features/auth/components/units-setting.tsx';
import { getErrorMessage } from '../../lib/errors.ts';
import { permissionWord, roleWord } from '../../lib/roles.ts';
import { paths } from '../paths.ts';

export default function AccountRoute() {
  const query = useMe();
  const signOut = useSignOut();
  return (
    <>
      <PageHeading title="Account" kicker="Who is signed in" />
      <QueryState query={query} label="Fetching your account…">
        {(me) => (
          <div className="grid gap-4 md:grid-cols-2">
            <Panel title={me.user.name} id="who">
              <dl className="space-y-2 text-lg">
                <div>
                  <dt className="text-sm text-muted">E-mail</dt>
                  <dd data-testid="account-email">{me.user.email}</dd>
                </div>
                <div>
                  <dt className="text-sm text-muted">Role</dt>
                  <dd data-testid="account-role" data-role={me.user.role}>
                    {roleWord[me.user.role] ?? me.user.role}
                  </dd>
                </div>
              </dl>
              <Button
                tone="primary"
                className="mt-5 w-full"
                disabled={signOut.isPending}
                onClick={() => {
                  // A full page load after signing out: nothing of this person's stays in memory
                  // on a shared tablet.
                  // When it fails, the message below says why and the person stays signed in.
                  signOut.mutateAsync().then(
                    () => window.location.replace(paths.signIn.getHref()),
                    () => undefined,
                  );
                }}
              >
                {signOut.isPending ? 'Signing out…' : 'Sign out'}
              </Button>
              {signOut.isError && <p className="mt-2 text-ember">{getErrorMessage(signOut.error)}</p>}
              <p className="mt-3 text-muted">On a shared tablet, sign out when you leave the bench.</p>
            </Panel>
            <Panel title="Units" id="units">
              <UnitsSetting />
            </Panel>
            <Panel title="You can open" id="rights">
              <ul className="space-y-1 text-lg">
                {me.permissions.map((p) => (
                  <li key={p} className="flex gap-2">
                    <span aria-hidden="true" className="text-sage">
                      ✓
                    </span>
                    {p === 'read:catalog' ? (
                      <Link to={paths.ingredients.getHref()} className="text-crust underline underline-offset-2">
                        {permissionWord[p]}
                      </Link>
                    ) : (
                      (permissionWord[p] ?? p)
                    )}
                  </li>
                ))}
              </ul>
              <p className="mt-3 text-muted">A new password or a different role: ask the owner.</p>
            </Panel>
          </div>
        )}
      </QueryState>
    </>
  );
}
