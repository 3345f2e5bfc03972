import { Alert } from '@/components/alert';
import { Button } from '@/components/button';
import { CheckboxField } from '@/components/checkbox-field';
import { isApiError } from '@/lib/api-client';
import type { Person } from '@/lib/person';
import { useResendEmailConfirmation } from '../api/resend-email-confirmation';
import { useUpdateOwnAccount } from '../api/update-own-account';

/** Consent a person can give or take back at any time; each change takes effect at once. */
export function EmailPreferences({ person }: { person: Person }) {
  const update = useUpdateOwnAccount();
  const error = update.error;

  return (
    <section aria-labelledby="preferences-heading" className="rounded-lg border border-line bg-surface">
      <h2 id="preferences-heading" className="border-b border-line px-5 py-4 text-lg font-semibold">
        E-mail and credit
      </h2>
      <div className="flex flex-col gap-3 p-5">
        {!person.emailConfirmed ? <ConfirmAddressNote email={person.email} /> : null}
        <CheckboxField
          label="Send me the newsletter"
          hint="An occasional e-mail from the science team about what volunteers found. Every newsletter has a one-click unsubscribe link."
          checked={person.newsletterOptIn}
          disabled={update.isPending}
          onChange={(event) => update.mutate({ newsletterOptIn: event.currentTarget.checked })}
        />
        <CheckboxField
          label="Name me on candidates I helped find"
          hint="Your display name is listed on candidates your verdicts led to. Unticked, you are counted but not named."
          checked={person.creditByName}
          disabled={update.isPending}
          onChange={(event) => update.mutate({ creditByName: event.currentTarget.checked })}
        />
        <p aria-live="polite" className="min-h-6 text-sm text-muted">
          {update.isSuccess ? 'Saved.' : null}
        </p>
        {error ? (
          <Alert tone="danger">{isApiError(error) ? error.message : 'Could not save; try again.'}</Alert>
        ) : null}
      </div>
    </section>
  );
}

/** Shown until the person follows the link in the address-confirmation mail. */
function ConfirmAddressNote({ email }: { email: string }) {
  const resend = useResendEmailConfirmation();
  const error = resend.error;
  return (
    <div className="flex flex-col gap-3 rounded-md border-l-4 border-amber bg-amber-wash px-4 py-3">
      <div className="flex flex-col gap-0.5 text-sm text-ink">
        <p className="font-semibold">Your address is not confirmed yet</p>
        <p>
          We mailed a link to <span className="break-all font-medium">{email}</span> when you signed up. It
          works for 24 hours; if it expired or never came, we can send another.
        </p>
      </div>
      <Button
        variant="secondary"
        className="self-start"
        busy={resend.isPending}
        onClick={() => resend.mutate()}
      >
        Send the link again
      </Button>
      <div aria-live="polite" className="text-sm empty:hidden">
        {resend.isSuccess ? <p className="font-medium text-success">{resend.data}</p> : null}
        {error ? (
          <p className="font-medium text-danger">
            {isApiError(error) ? error.message : 'Could not send the link; try again.'}
          </p>
        ) : null}
      </div>
    </div>
  );
}
