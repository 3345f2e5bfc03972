import { type FormEvent, useState } from 'react';
import { Link } from 'react-router-dom';
import { Alert } from '@/components/alert';
import { Button } from '@/components/button';
import { TextField } from '@/components/text-field';
import { paths } from '@/config/paths';
import { isApiError } from '@/lib/api-client';
import { useRequestPasswordReset } from '../api/request-password-reset';
import { AuthCard } from './auth-card';

/** Asks for a reset link. It says the same thing for every address, known or not. */
export function PasswordResetRequestForm() {
  const request = useRequestPasswordReset();
  const [email, setEmail] = useState('');
  const [missing, setMissing] = useState<string | undefined>();

  const serverError = isApiError(request.error) ? request.error : null;
  const emailError = missing ?? serverError?.fields.email;

  function submit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const address = email.trim();
    setMissing(address ? undefined : 'Enter the e-mail address you signed up with.');
    if (!address) return;
    request.mutate(address);
  }

  return (
    <AuthCard
      title="Reset your password"
      lead={
        <>
          Give the address you signed up with and we will mail you a link to choose a new password. Remembered
          it?{' '}
          <Link to={paths.signIn.getHref()} className="font-medium text-ink underline underline-offset-4">
            Sign in
          </Link>
        </>
      }
    >
      <form noValidate onSubmit={submit} className="flex flex-col gap-5" aria-label="Ask for a reset link">
        <div aria-live="polite" className="empty:hidden">
          {request.isSuccess ? (
            <Alert tone="success" title="Check your inbox">
              <p>{request.data}</p>
              <p className="mt-1">
                The link works once, for a limited time. Nothing arrived? Look in spam, or ask again.
              </p>
            </Alert>
          ) : null}
        </div>
        {serverError && !serverError.fields.email ? <Alert tone="danger">{serverError.message}</Alert> : null}
        {request.error && !serverError ? (
          <Alert tone="danger">Something went wrong. Please try again.</Alert>
        ) : null}
        <TextField
          label="E-mail"
          type="email"
          name="email"
          autoComplete="email"
          value={email}
          onChange={(event) => setEmail(event.target.value)}
          error={emailError}
        />
        <Button type="submit" busy={request.isPending} className="w-full">
          {request.isSuccess ? 'Send another link' : 'Send the link'}
        </Button>
      </form>
    </AuthCard>
  );
}
