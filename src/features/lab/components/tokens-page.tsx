import { type FormEvent, useEffect, useId, useRef, useState } from 'react';
import { Link } from 'react-router-dom';
import { Alert } from '@/components/alert';
import { Badge } from '@/components/badge';
import { Button } from '@/components/button';
import { ErrorBoundary } from '@/components/error-boundary';
import { LoadFailure } from '@/components/load-failure';
import { Loading } from '@/components/loading';
import { PageHeader } from '@/components/page-header';
import { Table, TableBody, TableHead, Td, Th, Tr } from '@/components/table';
import { TextField } from '@/components/text-field';
import { paths } from '@/config/paths';
import { isApiError } from '@/lib/api-client';
import { useCreateToken } from '../api/create-token';
import { useTokens } from '../api/get-tokens';
import { useRevokeToken } from '../api/revoke-token';
import { formatDateTime } from '../lib/format';
import type { CreatedToken, Token } from '../lib/tokens';

type Outcome = { tone: 'success' | 'danger'; text: string };

export function TokensPage() {
  const [created, setCreated] = useState<CreatedToken | null>(null);
  const [outcome, setOutcome] = useState<Outcome | null>(null);

  return (
    <div className="flex flex-col gap-8">
      <PageHeader
        eyebrow="Lab"
        title="API tokens"
        description={
          <p>
            Scripts use a token instead of your password: send it as{' '}
            <code className="tabular rounded-sm bg-surface px-1 text-sm text-ink">
              Authorization: Bearer …
            </code>
            . A token can do what you can do in the Lab. See the{' '}
            <Link
              to={paths.labApiReference.getHref()}
              className="font-medium text-ink underline decoration-line decoration-2 underline-offset-4 hover:decoration-amber"
            >
              API reference
            </Link>{' '}
            for what to call.
          </p>
        }
      />

      <div className="grid grid-cols-1 gap-8 lg:grid-cols-[minmax(0,2fr)_minmax(0,3fr)]">
        <section aria-labelledby="new-token-heading" className="flex flex-col gap-4">
          <h2 id="new-token-heading" className="text-xl font-semibold text-ink">
            New token
          </h2>
          <NewTokenForm
            onCreated={(answer) => {
              setCreated(answer);
              setOutcome(null);
            }}
          />
        </section>
        <div className="flex flex-col gap-4">
          {created ? <SecretOnce created={created} onDone={() => setCreated(null)} /> : null}
          <div aria-live="polite" className="empty:hidden">
            {outcome ? <Alert tone={outcome.tone}>{outcome.text}</Alert> : null}
          </div>
          <section aria-labelledby="tokens-heading" className="flex flex-col gap-4">
            <h2 id="tokens-heading" className="text-xl font-semibold text-ink">
              Your tokens
            </h2>
            <ErrorBoundary
              fallback={(_error, reset) => (
                <Alert tone="danger" title="The token list could not be shown">
                  <Button variant="secondary" className="mt-2" onClick={reset}>
                    Try again
                  </Button>
                </Alert>
              )}
            >
              <TokenList onOutcome={setOutcome} />
            </ErrorBoundary>
          </section>
        </div>
      </div>
    </div>
  );
}

function NewTokenForm({ onCreated }: { onCreated: (created: CreatedToken) => void }) {
  const create = useCreateToken();
  const [name, setName] = useState('');
  const [problem, setProblem] = useState<string | undefined>();

  function submit(event: FormEvent) {
    event.preventDefault();
    const trimmed = name.trim();
    if (!trimmed) {
      setProblem('Name the token, e.g. after the script that uses it');
      return;
    }
    setProblem(undefined);
    create.mutate(trimmed, {
      onSuccess: (answer) => {
        setName('');
        onCreated(answer);
      },
    });
  }

  const fields = isApiError(create.error) ? create.error.fields : {};
  return (
    <form
      noValidate
      onSubmit={submit}
      className="flex flex-col gap-4 rounded-lg border border-line bg-surface p-5"
    >
      <TextField
        label="Name"
        hint="Say where it is used (“nightly export on the cluster”), so you know which to revoke later."
        value={name}
        maxLength={80}
        onChange={(event) => setName(event.target.value)}
        error={problem ?? fields.name}
        autoComplete="off"
      />
      {create.isError && !fields.name ? (
        <Alert tone="danger" title="Could not make the token">
          {isApiError(create.error) ? create.error.message : 'Something went wrong.'}
        </Alert>
      ) : null}
      <div>
        <Button type="submit" busy={create.isPending}>
          Create token
        </Button>
      </div>
    </form>
  );
}

function SecretOnce({ created, onDone }: { created: CreatedToken; onDone: () => void }) {
  const [copied, setCopied] = useState<'yes' | 'failed' | null>(null);
  const secretRef = useRef<HTMLElement>(null);
  const headingRef = useRef<HTMLHeadingElement>(null);
  const headingId = useId();

  // The secret is the one thing on the page that needs doing now.
  useEffect(() => {
    headingRef.current?.focus();
  }, []);

  async function copy() {
    try {
      await navigator.clipboard.writeText(created.secret);
      setCopied('yes');
    } catch {
      // Without clipboard permission, select the text so a keyboard copy works.
      const range = document.createRange();
      if (secretRef.current) {
        range.selectNodeContents(secretRef.current);
        window.getSelection()?.removeAllRanges();
        window.getSelection()?.addRange(range);
      }
      setCopied('failed');
    }
  }

  return (
    <section
      aria-labelledby={headingId}
      className="flex flex-col gap-3 rounded-lg border-2 border-amber bg-amber-wash p-5"
    >
      <h2 id={headingId} ref={headingRef} tabIndex={-1} className="text-lg font-semibold text-ink">
        Copy the secret of “{created.token.name}” now
      </h2>
      <p className="text-sm text-ink">
        Dipdeck shows it this once and stores only a fingerprint of it. If you lose it, revoke the token and
        make a new one. Anyone who has it can act as you in the Lab.
      </p>
      <code
        ref={secretRef}
        data-testid="token-secret"
        className="tabular block rounded-md border border-edge bg-surface px-3 py-3 text-sm break-all text-ink select-all"
      >
        {created.secret}
      </code>
      <div className="flex flex-wrap items-center gap-3">
        <Button onClick={copy}>Copy secret</Button>
        <Button variant="secondary" onClick={onDone}>
          I have stored it
        </Button>
        <p aria-live="polite" className="text-sm text-ink">
          {copied === 'yes'
            ? 'Copied.'
            : copied === 'failed'
              ? 'Could not copy; the secret is selected, press Ctrl+C or ⌘C.'
              : ''}
        </p>
      </div>
    </section>
  );
}

function TokenList({ onOutcome }: { onOutcome: (outcome: Outcome) => void }) {
  const tokens = useTokens();
  if (tokens.isPending) return <Loading label="Loading your tokens…" />;
  if (tokens.isError) {
    return (
      <LoadFailure title="Could not load your tokens" error={tokens.error} onRetry={() => tokens.refetch()} />
    );
  }
  if (tokens.data.length === 0) {
    return (
      <p className="rounded-lg border border-dashed border-edge bg-surface px-4 py-5 text-base text-muted">
        You have no API tokens. Make one when a script needs to reach the Lab.
      </p>
    );
  }
  return (
    <Table caption="Your API tokens">
      <TableHead>
        <Th>Token</Th>
        <Th>Created</Th>
        <Th>Last used</Th>
        <Th className="text-right">
          <span className="sr-only">Action</span>
        </Th>
      </TableHead>
      <TableBody>
        {tokens.data.map((token) => (
          <TokenRow key={token.id} token={token} onOutcome={onOutcome} />
        ))}
      </TableBody>
    </Table>
  );
}

function TokenRow({ token, onOutcome }: { token: Token; onOutcome: (outcome: Outcome) => void }) {
  const revoke = useRevokeToken();
  const [confirming, setConfirming] = useState(false);
  const revoked = token.revokedAt !== null;

  function revokeNow() {
    revoke.mutate(token.id, {
      onSuccess: () => {
        setConfirming(false);
        onOutcome({
          tone: 'success',
          text: `${token.name} is revoked; scripts using it are refused from now on.`,
        });
      },
      onError: (error) => {
        setConfirming(false);
        onOutcome({
          tone: 'danger',
          text: `Could not revoke ${token.name}: ${isApiError(error) ? error.message : 'something went wrong.'}`,
        });
      },
    });
  }

  return (
    <Tr>
      <Td label="Token">
        <span className="flex min-w-0 flex-col text-right md:text-left">
          <span className={`font-medium ${revoked ? 'text-muted line-through' : 'text-ink'}`}>
            {token.name}
          </span>
          <span className="tabular text-sm text-slate">{token.prefix}…</span>
        </span>
      </Td>
      <Td label="Created">
        <span className="tabular text-sm text-slate md:whitespace-nowrap">
          {formatDateTime(token.createdAt)}
        </span>
      </Td>
      <Td label="Last used">
        <span className="tabular text-sm text-slate md:whitespace-nowrap">
          {token.lastUsedAt ? formatDateTime(token.lastUsedAt) : 'never'}
        </span>
      </Td>
      <Td label="Action" className="before:hidden md:text-right">
        {revoked ? (
          <Badge tone="danger">Revoked {formatDateTime(token.revokedAt)}</Badge>
        ) : confirming ? (
          <span className="flex w-full flex-wrap justify-end gap-2">
            <Button
              variant="danger"
              busy={revoke.isPending}
              onClick={revokeNow}
              aria-label={`Revoke ${token.name} now`}
            >
              Revoke now
            </Button>
            <Button variant="secondary" onClick={() => setConfirming(false)}>
              Keep
            </Button>
          </span>
        ) : (
          <Button
            variant="danger"
            className="w-full md:w-auto"
            aria-label={`Revoke ${token.name}`}
            onClick={() => setConfirming(true)}
          >
            Revoke
          </Button>
        )}
      </Td>
    </Tr>
  );
}
