import { useState, type FormEvent } from 'react';
import { Button } from '../../../components/button.tsx';
import { TextField } from '../../../components/field.tsx';
import { getErrorMessage } from '../../../lib/errors.ts';
import { useRequestPasswordReset } from '../api/request-password-reset.ts';

export function ResetRequestForm() {
  const request = useRequestPasswordReset();
  const [email, setEmail] = useState('');

  const submit = (e: FormEvent) => {
    e.preventDefault();
    request.mutate({ email: email.trim() });
  };

  if (request.isSuccess) {
    return (
      <p role="status" className="rounded-xl bg-sage-soft px-3 py-3 text-sage">
        If <strong>{email.trim()}</strong> has an account, a message with a link to set a new password is on its way. The link
        works for a short while only.
      </p>
    );
  }
  return (
    <form onSubmit={submit} className="space-y-4" noValidate>
      <p className="text-muted">Type the e-mail address of your account. We send a link to choose a new password.</p>
      <TextField label="E-mail" type="email" name="email" autoComplete="username" required value={email} onChange={(e) => setEmail(e.target.value)} />
      {request.isError && (
        <p role="alert" className="rounded-xl bg-ember-soft px-3 py-2 font-semibold text-ember">
          {getErrorMessage(request.error)}
        </p>
      )}
      <Button type="submit" tone="primary" className="w-full" disabled={request.isPending || !email.includes('@')}>
        {request.isPending ? 'Sending…' : 'Send the link'}
      </Button>
    </form>
  );
}
