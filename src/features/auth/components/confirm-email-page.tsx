import { useEffect, useRef } from 'react';
import { Alert } from '@/components/alert';
import { Button, ButtonLink } from '@/components/button';
import { Loading } from '@/components/loading';
import { paths } from '@/config/paths';
import { isApiError } from '@/lib/api-client';
import { useConfirmEmail } from '../api/confirm-email';
import { AuthCard } from './auth-card';

interface ConfirmEmailPageProps {
  token: string | null;
  /** Whether someone is signed in here: where to go next depends on it. */
  signedIn: boolean;
}

/** Confirms an address with the token from the mail, once, as soon as the page opens. */
export function ConfirmEmailPage({ token, signedIn }: ConfirmEmailPageProps) {
  const confirm = useConfirmEmail();
  const { mutate } = confirm;
  // A token works once: StrictMode's second run of the effect (and any re-render) must not post it again,
  // or the second answer would say "already used" over the first one's "confirmed".
  const postedToken = useRef<string | null>(null);

  useEffect(() => {
    if (!token || postedToken.current === token) return;
    postedToken.current = token;
    mutate(token);
  }, [token, mutate]);

  const next = signedIn ? (
    <ButtonLink to={paths.record.getHref()} className="w-full">
      Open My record
    </ButtonLink>
  ) : (
    <ButtonLink to={paths.signIn.getHref()} className="w-full">
      Sign in
    </ButtonLink>
  );

  if (!token) {
    return (
      <AuthCard title="This link is incomplete" lead="The address has no confirmation token in it.">
        <Alert tone="note">
          Mail programs sometimes cut long links: copy the whole link from the mail. You can ask for a new one
          on My record.
        </Alert>
        {next}
      </AuthCard>
    );
  }

  const error = confirm.error;
  const refused = isApiError(error) && (error.code === 'token_invalid' || Boolean(error.fields.token));

  return (
    <AuthCard
      title="Confirm your address"
      lead="Following the link in our mail shows us the address is yours."
    >
      <div aria-live="polite" className="flex flex-col gap-4">
        {confirm.isSuccess ? (
          <Alert tone="success" title="Your address is confirmed">
            <span className="break-all">{confirm.data.email}</span> is confirmed. Thank you.
          </Alert>
        ) : refused ? (
          <Alert tone="danger" title="This link no longer works">
            <p>
              {error.fields.token ?? error.message} Confirmation links work once and expire after 24 hours.
            </p>
            <p className="mt-1">
              {signedIn ? 'Ask for a new link on My record.' : 'Sign in and ask for a new link on My record.'}
            </p>
          </Alert>
        ) : error ? (
          <Alert tone="danger" title="Could not confirm your address">
            <p>{isApiError(error) ? error.message : 'Something went wrong.'}</p>
            <Button variant="secondary" className="mt-2" onClick={() => mutate(token)}>
              Try again
            </Button>
          </Alert>
        ) : (
          <Loading label="Confirming your address…" />
        )}
      </div>
      {confirm.isPending || confirm.isIdle ? null : next}
    </AuthCard>
  );
}
