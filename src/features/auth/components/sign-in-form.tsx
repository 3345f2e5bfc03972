import { type FormEvent, useState } from 'react';
import { Link } from 'react-router-dom';
import { Alert } from '@/components/alert';
import { Button } from '@/components/button';
import { TextField } from '@/components/text-field';
import { paths } from '@/config/paths';
import { isApiError } from '@/lib/api-client';
import type { Person } from '@/lib/person';
import { useSignIn } from '../api/sign-in';
import { AuthCard } from './auth-card';

const knownFields = ['email', 'password'];

interface SignInFormProps {
  redirectTo?: string | undefined;
  onSignedIn: (person: Person) => void;
}

export function SignInForm({ redirectTo, onSignedIn }: SignInFormProps) {
  const signIn = useSignIn();
  const [email, setEmail] = useState('');
  const [password, setPassword] = useState('');
  const [missing, setMissing] = useState<Record<string, string>>({});

  const serverError = isApiError(signIn.error) ? signIn.error : null;
  const fieldErrors = { ...(serverError?.fields ?? {}), ...missing };

  function submit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const next: Record<string, string> = {};
    if (!email.trim()) next.email = 'Enter the e-mail address you signed up with.';
    if (!password) next.password = 'Enter your password.';
    setMissing(next);
    if (Object.keys(next).length > 0) return;
    signIn.mutate({ email: email.trim(), password }, { onSuccess: onSignedIn });
  }

  return (
    <AuthCard
      title="Sign in"
      lead={
        <>
          New to Dipdeck?{' '}
          <Link
            to={paths.signUp.getHref(redirectTo)}
            className="font-medium text-ink underline underline-offset-4"
          >
            Create an account
          </Link>
        </>
      }
    >
      <form noValidate onSubmit={submit} className="flex flex-col gap-5" aria-label="Sign in">
        {serverError && !Object.keys(serverError.fields).some((field) => knownFields.includes(field)) ? (
          <Alert tone="danger">{serverError.message}</Alert>
        ) : null}
        {signIn.error && !serverError ? (
          <Alert tone="danger">Something went wrong. Please try again.</Alert>
        ) : null}
        <TextField
          label="E-mail"
          type="email"
          name="email"
          autoComplete="email"
          value={email}
          onChange={(event) => setEmail(event.target.value)}
          error={fieldErrors.email}
        />
        <TextField
          label="Password"
          type="password"
          name="password"
          autoComplete="current-password"
          value={password}
          onChange={(event) => setPassword(event.target.value)}
          error={fieldErrors.password}
        />
        <Link
          to={paths.passwordReset.getHref()}
          className="-mt-3 flex min-h-target items-center self-start text-sm font-medium text-ink underline underline-offset-4"
        >
          Forgot your password?
        </Link>
        <Button type="submit" busy={signIn.isPending} className="w-full">
          Sign in
        </Button>
      </form>
    </AuthCard>
  );
}
