import { type FormEvent, useState } from 'react';
import { Link } from 'react-router-dom';
import { Alert } from '@/components/alert';
import { Button } from '@/components/button';
import { CheckboxField } from '@/components/checkbox-field';
import { TextField } from '@/components/text-field';
import { paths } from '@/config/paths';
import { isApiError } from '@/lib/api-client';
import type { Person } from '@/lib/person';
import { minPasswordLength, useSignUp } from '../api/sign-up';
import { AuthCard } from './auth-card';

const knownFields = ['email', 'displayName', 'password', 'newsletterOptIn'];

interface SignUpFormProps {
  redirectTo?: string | undefined;
  onSignedUp: (person: Person) => void;
}

export function SignUpForm({ redirectTo, onSignedUp }: SignUpFormProps) {
  const signUp = useSignUp();
  const [email, setEmail] = useState('');
  const [displayName, setDisplayName] = useState('');
  const [password, setPassword] = useState('');
  // Opting in is a choice the person makes; it never starts ticked.
  const [newsletterOptIn, setNewsletterOptIn] = useState(false);
  const [local, setLocal] = useState<Record<string, string>>({});

  const serverError = isApiError(signUp.error) ? signUp.error : null;
  const fieldErrors = { ...(serverError?.fields ?? {}), ...local };

  function submit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const next: Record<string, string> = {};
    if (!email.trim()) next.email = 'Enter an e-mail address.';
    if (!displayName.trim()) next.displayName = 'Enter the name other people will see.';
    if (password.length < minPasswordLength) {
      next.password = `Use at least ${minPasswordLength} characters.`;
    }
    setLocal(next);
    if (Object.keys(next).length > 0) return;
    signUp.mutate(
      { email: email.trim(), displayName: displayName.trim(), password, newsletterOptIn },
      { onSuccess: onSignedUp },
    );
  }

  return (
    <AuthCard
      title="Create your account"
      lead={
        <>
          Already have one?{' '}
          <Link
            to={paths.signIn.getHref(redirectTo)}
            className="font-medium text-ink underline underline-offset-4"
          >
            Sign in
          </Link>
        </>
      }
    >
      <form noValidate onSubmit={submit} className="flex flex-col gap-5" aria-label="Create your account">
        {serverError && !Object.keys(serverError.fields).some((field) => knownFields.includes(field)) ? (
          <Alert tone="danger">{serverError.message}</Alert>
        ) : null}
        {signUp.error && !serverError ? (
          <Alert tone="danger">Something went wrong. Please try again.</Alert>
        ) : null}
        <TextField
          label="E-mail"
          type="email"
          name="email"
          autoComplete="email"
          value={email}
          onChange={(event) => setEmail(event.target.value)}
          hint="Used to sign in. We never show it to other volunteers."
          error={fieldErrors.email}
        />
        <TextField
          label="Display name"
          name="displayName"
          autoComplete="nickname"
          value={displayName}
          onChange={(event) => setDisplayName(event.target.value)}
          hint="Shown beside the dips you help find."
          error={fieldErrors.displayName}
        />
        <TextField
          label="Password"
          type="password"
          name="password"
          autoComplete="new-password"
          value={password}
          onChange={(event) => setPassword(event.target.value)}
          hint={`At least ${minPasswordLength} characters. A short sentence works well.`}
          error={fieldErrors.password}
        />
        <CheckboxField
          name="newsletterOptIn"
          checked={newsletterOptIn}
          onChange={(event) => setNewsletterOptIn(event.target.checked)}
          label="Send me the Dipdeck newsletter"
          hint="An occasional e-mail from the science team about what volunteers have found. Leave this unticked and we will not send it. You can change this at any time."
          error={fieldErrors.newsletterOptIn}
        />
        <Button type="submit" busy={signUp.isPending} className="w-full">
          Create account
        </Button>
      </form>
    </AuthCard>
  );
}
