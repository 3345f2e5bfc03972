import { type FormEvent, useState } from 'react';
import { Link } from 'react-router-dom';
import { Alert } from '@/components/alert';
import { Button, ButtonLink } from '@/components/button';
import { TextField } from '@/components/text-field';
import { paths } from '@/config/paths';
import { isApiError } from '@/lib/api-client';
import { useConfirmPasswordReset } from '../api/confirm-password-reset';
import { minPasswordLength } from '../api/sign-up';
import { AuthCard } from './auth-card';

const linkClasses = 'font-medium underline underline-offset-4';

/** Sets a new password with the token from a reset mail. */
export function PasswordResetConfirmForm({ token }: { token: string | null }) {
  const confirm = useConfirmPasswordReset();
  const [password, setPassword] = useState('');
  const [repeat, setRepeat] = useState('');
  const [local, setLocal] = useState<Record<string, string>>({});

  const serverError = isApiError(confirm.error) ? confirm.error : null;
  const tokenRefused = serverError?.code === 'token_invalid' || Boolean(serverError?.fields.token);
  const fieldErrors = { ...(serverError?.fields ?? {}), ...local };

  if (!token) {
    return (
      <AuthCard title="This link is incomplete" lead="The address has no reset token in it.">
        <Alert tone="note">
          Mail programs sometimes cut long links. Copy the whole link from the mail, or{' '}
          <Link to={paths.passwordReset.getHref()} className={linkClasses}>
            ask for a new link
          </Link>
          .
        </Alert>
      </AuthCard>
    );
  }

  if (confirm.isSuccess) {
    return (
      <AuthCard title="Your password is changed" lead="Use the new one from now on.">
        <div aria-live="polite">
          <Alert tone="success">You are signed out everywhere; sign in with the new password.</Alert>
        </div>
        <ButtonLink to={paths.signIn.getHref()} className="w-full">
          Sign in
        </ButtonLink>
      </AuthCard>
    );
  }

  function submit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const next: Record<string, string> = {};
    if (password.length < minPasswordLength) next.password = `Use at least ${minPasswordLength} characters.`;
    if (!repeat) next.repeat = 'Type the new password again.';
    else if (repeat !== password) next.repeat = 'The two passwords are not the same.';
    setLocal(next);
    if (Object.keys(next).length > 0) return;
    confirm.mutate({ token: token ?? '', password });
  }

  return (
    <AuthCard
      title="Choose a new password"
      lead="Changing it signs you out on every device, this one included."
    >
      <form noValidate onSubmit={submit} className="flex flex-col gap-5" aria-label="Choose a new password">
        <div aria-live="polite" className="empty:hidden">
          {tokenRefused ? (
            <Alert tone="danger" title="This link no longer works">
              <p>
                {serverError?.fields.token ?? serverError?.message} Reset links work once and expire after a
                while.
              </p>
              <Link
                to={paths.passwordReset.getHref()}
                className={`${linkClasses} inline-flex min-h-target items-center`}
              >
                Ask for a new link
              </Link>
            </Alert>
          ) : serverError && !serverError.fields.password ? (
            <Alert tone="danger">{serverError.message}</Alert>
          ) : confirm.error && !serverError ? (
            <Alert tone="danger">Something went wrong. Please try again.</Alert>
          ) : null}
        </div>
        <TextField
          label="New password"
          type="password"
          name="password"
          autoComplete="new-password"
          value={password}
          onChange={(event) => setPassword(event.target.value)}
          hint={`At least ${minPasswordLength} characters, and not a common password. A short sentence works well.`}
          error={fieldErrors.password}
        />
        <TextField
          label="New password again"
          type="password"
          name="repeat"
          autoComplete="new-password"
          value={repeat}
          onChange={(event) => setRepeat(event.target.value)}
          error={fieldErrors.repeat}
        />
        <Button type="submit" busy={confirm.isPending} className="w-full">
          Save the new password
        </Button>
      </form>
    </AuthCard>
  );
}
