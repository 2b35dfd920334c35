import { useState, type FormEvent } from 'react';
import { Link } from 'react-router';
import { Button } from '../../../components/button.tsx';
import { TextField } from '../../../components/field.tsx';
import { statusOf } from '../../../lib/api-client.ts';
import { getErrorMessage } from '../../../lib/errors.ts';
import { useSignIn } from '../api/sign-in.ts';

export function SignInForm({ onSignedIn, forgotHref }: { onSignedIn: () => void; forgotHref: string }) {
  const signIn = useSignIn();
  const [email, setEmail] = useState('');
  const [password, setPassword] = useState('');

  const submit = (e: FormEvent) => {
    e.preventDefault();
    signIn.mutate({ email: email.trim(), password }, { onSuccess: onSignedIn });
  };

  const error = signIn.isError
    ? statusOf(signIn.error) === 401
      ? 'That e-mail and password do not match an account.'
      : getErrorMessage(signIn.error)
    : null;

  return (
    <form onSubmit={submit} className="space-y-4" noValidate>
      <TextField label="E-mail" type="email" name="email" autoComplete="username" required value={email} onChange={(e) => setEmail(e.target.value)} />
      <TextField
        label="Password"
        type="password"
        name="password"
        autoComplete="current-password"
        required
        value={password}
        onChange={(e) => setPassword(e.target.value)}
      />
      {error && (
        <p role="alert" className="rounded-xl bg-ember-soft px-3 py-2 font-semibold text-ember">
          {error}
        </p>
      )}
      <Button type="submit" tone="primary" className="w-full" disabled={signIn.isPending || !email || !password}>
        {signIn.isPending ? 'Signing in…' : 'Sign in'}
      </Button>
      <p className="text-center">
        <Link to={forgotHref} className="inline-flex min-h-12 items-center text-crust underline underline-offset-4">
          Forgot the password?
        </Link>
      </p>
    </form>
  );
}
