// Accounts, for the owner (admin): who may sign in and with which role, adding a person (they get
// a link to set their own password), changing a role, removing, sending a reset link, and the
// list of who changed what.
import { useState, type FormEvent } from 'react';
import type { AccountSummary } from '#shared/api';
import { ROLES, type Role } from '#shared/permissions';
import { Button } from '../../components/button.tsx';
import { SelectField, TextField } from '../../components/field.tsx';
import { PageHeading, Panel } from '../../components/panel.tsx';
import { QueryState } from '../../components/query-state.tsx';
import { useAccounts, useAddAccount, useAudit, useChangeRole, useRemoveAccount, useSendResetLink } from '../../features/accounts/api/accounts.ts';
import { useMe } from '../../features/auth/api/get-me.ts';
import { getErrorMessage } from '../../lib/errors.ts';
import { roleWord } from '../../lib/roles.ts';

const actionWord: Record<string, string> = {
  'account.add': 'added',
  'account.role': 'changed the role of',
  'account.remove': 'removed',
  'account.reset-link': 'sent a reset link to',
  'account.password': 'set a new password for',
};

function RoleOptions() {
  return (
    <>
      {ROLES.map((r) => (
        <option key={r} value={r}>
          {roleWord[r]}
        </option>
      ))}
    </>
  );
}

function AddAccountForm() {
  const add = useAddAccount();
  const [email, setEmail] = useState('');
  const [name, setName] = useState('');
  const [role, setRole] = useState<Role>('bench');
  const [added, setAdded] = useState<string | null>(null);
  const submit = (e: FormEvent) => {
    e.preventDefault();
    setAdded(null);
    add.mutate(
      { email: email.trim(), name: name.trim(), role },
      {
        onSuccess: (r) => {
          setAdded(r.user.email);
          setEmail('');
          setName('');
        },
      },
    );
  };
  return (
    <form onSubmit={submit} className="space-y-4" noValidate aria-label="Add an account">
      <TextField label="E-mail" type="email" name="email" required value={email} onChange={(e) => setEmail(e.target.value)} />
      <TextField label="Name" name="name" value={name} onChange={(e) => setName(e.target.value)} hint="As shown in the viewer" />
      <SelectField label="Role" name="role" value={role} onChange={(e) => setRole(e.target.value as Role)}>
        <RoleOptions />
      </SelectField>
      {add.isError && (
        <p role="alert" className="rounded-xl bg-ember-soft px-3 py-2 font-semibold text-ember">
          {getErrorMessage(add.error)}
        </p>
      )}
      {added && (
        <p role="status" className="rounded-xl bg-sage-soft px-3 py-3 text-sage">
          <strong>{added}</strong> is added; a message with a link to choose a password is on its way (the link works for 7 days).
        </p>
      )}
      <Button type="submit" tone="primary" className="w-full" disabled={add.isPending || !email.includes('@')}>
        {add.isPending ? 'Adding…' : 'Add the account'}
      </Button>
    </form>
  );
}

function AccountRow({ account, isMe }: { account: AccountSummary; isMe: boolean }) {
  const changeRole = useChangeRole();
  const remove = useRemoveAccount();
  const reset = useSendResetLink();
  const [confirming, setConfirming] = useState(false);
  const error = changeRole.error ?? remove.error ?? reset.error;
  return (
    <li className="space-y-2 border-b border-line py-3 last:border-0" data-testid="account-row" data-email={account.email}>
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <div>
          <p className="text-lg font-semibold">
            {account.name || account.email}
            {isMe && <span className="ml-2 text-sm font-normal text-muted">(you)</span>}
          </p>
          {account.name && <p className="text-muted">{account.email}</p>}
        </div>
        <SelectField
          label={<span className="sr-only">Role of {account.email}</span>}
          className="min-w-56"
          value={account.role}
          disabled={changeRole.isPending}
          onChange={(e) => changeRole.mutate({ id: account.id, role: e.target.value as Role })}
        >
          <RoleOptions />
        </SelectField>
      </div>
      <div className="flex flex-wrap gap-2">
        <Button disabled={reset.isPending} onClick={() => reset.mutate(account.id)}>
          {reset.isPending ? 'Sending…' : 'Send a reset link'}
        </Button>
        {!isMe &&
          (confirming ? (
            <>
              <Button tone="primary" disabled={remove.isPending} onClick={() => remove.mutate(account.id)}>
                {remove.isPending ? 'Removing…' : `Remove ${account.email}`}
              </Button>
              <Button onClick={() => setConfirming(false)}>Keep</Button>
            </>
          ) : (
            <Button onClick={() => setConfirming(true)}>Remove…</Button>
          ))}
      </div>
      {reset.isSuccess && <p role="status" className="text-sage">{reset.data.message}.</p>}
      {error && (
        <p role="alert" className="font-semibold text-ember">
          {getErrorMessage(error)}
        </p>
      )}
    </li>
  );
}

export default function AccountsRoute() {
  const accounts = useAccounts();
  const audit = useAudit();
  const me = useMe().data;
  return (
    <>
      <PageHeading title="Accounts" kicker="Who may sign in, and what they see" />
      <div className="grid gap-4 lg:grid-cols-[2fr_1fr]">
        <Panel title="People" id="people">
          <QueryState query={accounts} label="Fetching the accounts…">
            {(data) => (
              <ul>
                {data.users.map((u) => (
                  <AccountRow key={u.id} account={u} isMe={u.id === me?.user.id} />
                ))}
              </ul>
            )}
          </QueryState>
        </Panel>
        <Panel title="Add a person" id="add">
          <AddAccountForm />
        </Panel>
      </div>
      <Panel title="Who changed what" id="audit" className="mt-4">
        <QueryState query={audit} label="Fetching the changes to accounts…">
          {(data) =>
            data.entries.length === 0 ? (
              <p className="text-muted">No account has been changed yet.</p>
            ) : (
              <ol className="space-y-1" data-testid="audit-list">
                {data.entries.map((e) => (
                  <li key={e.id} className="flex flex-wrap gap-x-2">
                    <time dateTime={e.at} className="font-mono text-muted">
                      {new Date(e.at).toLocaleString()}
                    </time>
                    <span>
                      {e.actor} {actionWord[e.action] ?? e.action} <strong>{e.target}</strong>
                      {e.detail && <span className="text-muted"> ({e.detail})</span>}
                    </span>
                  </li>
                ))}
              </ol>
            )
          }
        </QueryState>
      </Panel>
    </>
  );
}
