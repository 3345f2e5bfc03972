import { type FormEvent, useId, useState } from 'react';
import { Alert } from '@/components/alert';
import { Button } from '@/components/button';
import { TextField } from '@/components/text-field';
import { isApiError } from '@/lib/api-client';
import { useDeleteOwnAccount } from '../api/delete-own-account';

interface DeleteAccountProps {
  /** Called once the server has deleted the account and ended the session. */
  onDeleted: () => void;
}

/** Deleting an account, in two steps: what goes and what stays first, then the password to confirm. */
export function DeleteAccount({ onDeleted }: DeleteAccountProps) {
  const remove = useDeleteOwnAccount();
  const [open, setOpen] = useState(false);
  const [password, setPassword] = useState('');
  const [missing, setMissing] = useState<string | undefined>();
  const formId = useId();
  const openerId = useId();

  const serverError = isApiError(remove.error) ? remove.error : null;
  const passwordError = missing ?? serverError?.fields.password;

  function close() {
    setOpen(false);
    setPassword('');
    setMissing(undefined);
    remove.reset();
    document.getElementById(openerId)?.focus();
  }

  function submit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    setMissing(password ? undefined : 'Enter your password to confirm it is you.');
    if (!password) return;
    remove.mutate(password, { onSuccess: onDeleted });
  }

  return (
    <section aria-labelledby="delete-account-heading" className="rounded-lg border border-line bg-surface">
      <h2 id="delete-account-heading" className="border-b border-line px-5 py-4 text-lg font-semibold">
        Delete my account
      </h2>
      <div className="flex flex-col gap-4 p-5 text-base">
        <div className="flex flex-col gap-2">
          <p className="text-ink">Deleting your account removes, for good:</p>
          <ul className="flex list-disc flex-col gap-1 pl-5 text-muted">
            <li>your e-mail address, so we send you nothing more, newsletter included;</li>
            <li>your display name, wherever it was shown, candidates included;</li>
            <li>your sign-in: the password stops working and you are signed out.</li>
          </ul>
          <p className="text-ink">What stays:</p>
          <p className="text-muted">
            Your verdicts, without your name or address. They are part of the science record: consensus
            scores, dips and candidates were computed from them, and removing them would change results
            already shared.
          </p>
        </div>
        <Button
          id={openerId}
          variant="danger"
          className="self-start"
          aria-expanded={open}
          aria-controls={formId}
          onClick={() => setOpen(true)}
        >
          Delete my account…
        </Button>
        {open ? (
          <form
            id={formId}
            noValidate
            onSubmit={submit}
            aria-label="Confirm deleting your account"
            className="flex flex-col gap-4 rounded-md border border-danger bg-danger-wash/40 p-4"
          >
            <p className="text-sm font-medium text-ink">
              This cannot be undone. Enter your password to confirm.
            </p>
            {serverError && !serverError.fields.password ? (
              <Alert tone="danger">{serverError.message}</Alert>
            ) : null}
            {remove.error && !serverError ? (
              <Alert tone="danger">Something went wrong. Please try again.</Alert>
            ) : null}
            <TextField
              label="Your password"
              type="password"
              name="password"
              autoComplete="current-password"
              autoFocus
              value={password}
              onChange={(event) => setPassword(event.target.value)}
              error={passwordError}
            />
            <div className="flex flex-wrap gap-2">
              <Button type="submit" variant="danger" busy={remove.isPending} className="whitespace-nowrap">
                Delete my account for good
              </Button>
              <Button variant="quiet" onClick={close} disabled={remove.isPending}>
                Keep my account
              </Button>
            </div>
          </form>
        ) : null}
      </div>
    </section>
  );
}
