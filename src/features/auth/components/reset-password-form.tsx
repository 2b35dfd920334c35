import { useState, type FormEvent } from 'react';
import { Button } from '../../../components/button.tsx';
import { TextField } from '../../../components/field.tsx';
import { getErrorMessage } from '../../../lib/errors.ts';
import { useConfirmPasswordReset } from '../api/confirm-password-reset.ts';

export const MIN_PASSWORD_LENGTH = 10;

export function ResetPasswordForm({ token, onDone }: { token: string; onDone: () => void }) {
  const confirm = useConfirmPasswordReset();
  const [password, setPassword] = useState('');
  const [again, setAgain] = useState('');

  const tooShort = password.length > 0 && password.length < MIN_PASSWORD_LENGTH;
  const mismatch = again.length > 0 && again !== password;

  const submit = (e: FormEvent) => {
    e.preventDefault();
    if (tooShort || mismatch || !password) return;
    confirm.mutate({ token, password }, { onSuccess: onDone });
  };

  return (
    <form onSubmit={submit} className="space-y-4" noValidate>
      <TextField
        label="New password"
        type="password"
        autoComplete="new-password"
        value={password}
        onChange={(e) => setPassword(e.target.value)}
        hint={`At least ${MIN_PASSWORD_LENGTH} characters.`}
        error={tooShort ? `Too short: at least ${MIN_PASSWORD_LENGTH} characters.` : undefined}
      />
      <TextField
        label="The same again"
        type="password"
        autoComplete="new-password"
        value={again}
        onChange={(e) => setAgain(e.target.value)}
        error={mismatch ? 'The two passwords differ.' : undefined}
      />
      {confirm.isError && (
        <p role="alert" className="rounded-xl bg-ember-soft px-3 py-2 font-semibold text-ember">
          {getErrorMessage(confirm.error)}
        </p>
      )}
      <Button type="submit" tone="primary" className="w-full" disabled={confirm.isPending || !password || tooShort || again !== password}>
        {confirm.isPending ? 'Saving…' : 'Set the new password'}
      </Button>
    </form>
  );
}
