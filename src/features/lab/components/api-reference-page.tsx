import { useState } from 'react';
import { Link } from 'react-router-dom';
import { Alert } from '@/components/alert';
import { Button } from '@/components/button';
import { ErrorBoundary } from '@/components/error-boundary';
import { LoadFailure } from '@/components/load-failure';
import { Loading } from '@/components/loading';
import { PageHeader } from '@/components/page-header';
import { paths } from '@/config/paths';
import { useOpenApi } from '../api/get-openapi';
import {
  type ApiReference,
  curlExample,
  exampleBaseUrl,
  type HttpMethod,
  type Operation,
  type SchemaRow,
} from '../lib/openapi';

export function ApiReferencePage() {
  return (
    <div className="flex flex-col gap-8">
      <PageHeader
        eyebrow="Lab"
        title="API reference"
        description={
          <p>
            Everything the Lab does can be scripted. Make a token on{' '}
            <Link
              to={paths.labTokens.getHref()}
              className="font-medium text-ink underline decoration-line decoration-2 underline-offset-4 hover:decoration-amber"
            >
              API tokens
            </Link>
            , put it in <code className="tabular text-sm text-ink">DIPDECK_TOKEN</code>, and send it as a
            Bearer token; requests with a token need no CSRF header.
          </p>
        }
      />
      <ErrorBoundary
        fallback={(_error, reset) => (
          <Alert tone="danger" title="The API reference could not be shown">
            <Button variant="secondary" className="mt-2" onClick={reset}>
              Try again
            </Button>
          </Alert>
        )}
      >
        <Reference />
      </ErrorBoundary>
    </div>
  );
}

function Reference() {
  const reference = useOpenApi();
  if (reference.isPending) return <Loading label="Loading the API reference…" />;
  if (reference.isError) {
    return (
      <LoadFailure
        title="Could not load the API description"
        error={reference.error}
        onRetry={() => reference.refetch()}
      />
    );
  }
  return <ReferenceView reference={reference.data} />;
}

function ReferenceView({ reference }: { reference: ApiReference }) {
  const baseUrl = exampleBaseUrl(reference.serverUrl, window.location.origin);
  const count = reference.groups.reduce((sum, group) => sum + group.operations.length, 0);
  return (
    <div className="grid grid-cols-1 gap-8 lg:grid-cols-[13rem_minmax(0,1fr)]">
      <nav aria-label="API sections" className="lg:sticky lg:top-20 lg:self-start">
        <p className="tabular mb-2 text-xs font-medium tracking-[0.14em] text-amber-ink uppercase">
          {reference.title} · v{reference.version}
        </p>
        <ul className="flex flex-wrap gap-1 lg:flex-col">
          {reference.groups.map((group) => (
            <li key={group.tag}>
              <a
                href={`#tag-${group.tag}`}
                className="flex min-h-target min-w-target items-center justify-between gap-3 rounded-md px-3 text-base font-medium text-ink hover:bg-amber-wash"
              >
                <span className="capitalize">{group.tag}</span>
                <span className="tabular text-xs text-muted">{group.operations.length}</span>
              </a>
            </li>
          ))}
        </ul>
      </nav>
      <div className="flex min-w-0 flex-col gap-10">
        <div className="flex flex-col gap-2 rounded-lg border border-line bg-surface p-4 text-sm text-muted">
          <p>
            <span className="tabular text-ink">{count}</span> operations at{' '}
            <code className="tabular break-all text-ink">{baseUrl}</code>. Errors come back as{' '}
            <code className="tabular text-ink">{'{"error": {"code", "message", "fields"}}'}</code>, with{' '}
            <code className="tabular text-ink">fields</code> naming each input to correct.
          </p>
          {reference.description ? (
            <p>
              <InlineText text={reference.description} />
            </p>
          ) : null}
        </div>
        {reference.groups.map((group) => (
          <section
            key={group.tag}
            id={`tag-${group.tag}`}
            aria-labelledby={`tag-${group.tag}-heading`}
            className="flex scroll-mt-20 flex-col gap-4"
          >
            <h2 id={`tag-${group.tag}-heading`} className="text-xl font-semibold text-ink capitalize">
              {group.tag}
            </h2>
            {group.operations.map((operation) => (
              <OperationCard key={operation.anchor} operation={operation} baseUrl={baseUrl} />
            ))}
          </section>
        ))}
      </div>
    </div>
  );
}

const methodStyles: Record<HttpMethod, string> = {
  get: 'bg-slate-wash text-slate',
  post: 'bg-success-wash text-success',
  put: 'bg-amber-wash text-amber-ink',
  patch: 'bg-amber-wash text-amber-ink',
  delete: 'bg-danger-wash text-danger',
};

function MethodBadge({ method }: { method: HttpMethod }) {
  return (
    <span
      className={`tabular inline-flex w-16 shrink-0 justify-center rounded-sm py-0.5 text-xs font-semibold uppercase ${methodStyles[method]}`}
    >
      {method}
    </span>
  );
}

function OperationCard({ operation, baseUrl }: { operation: Operation; baseUrl: string }) {
  const [copied, setCopied] = useState(false);
  const curl = curlExample(operation, baseUrl);
  const pathParameters = operation.parameters.filter((parameter) => parameter.in === 'path');
  const queryParameters = operation.parameters.filter((parameter) => parameter.in !== 'path');

  return (
    <article
      id={operation.anchor}
      aria-labelledby={`${operation.anchor}-heading`}
      className="flex scroll-mt-20 flex-col gap-4 rounded-lg border border-line bg-surface p-4 md:p-5"
    >
      <header className="flex flex-col gap-2">
        <h3 id={`${operation.anchor}-heading`} className="flex flex-wrap items-center gap-x-3 gap-y-1">
          <MethodBadge method={operation.method} />
          <code className="tabular text-base font-medium break-all text-ink">{operation.path}</code>
        </h3>
        <p className="text-base text-ink">
          <InlineText text={operation.summary} />
        </p>
        {operation.whoMayCall ? (
          <p className="text-sm text-muted">
            <span className="font-medium text-ink">Who may call it:</span> {operation.whoMayCall}
          </p>
        ) : null}
        {operation.description ? (
          <p className="text-sm text-muted">
            <InlineText text={operation.description} />
          </p>
        ) : null}
      </header>

      {pathParameters.length > 0 ? <FieldList title="Path" rows={pathParameters} /> : null}
      {queryParameters.length > 0 ? <FieldList title="Query" rows={queryParameters} /> : null}
      {operation.body ? (
        <FieldList
          title={`Body · ${operation.body.contentType}`}
          rows={operation.body.rows}
          empty="Any JSON object; no fields are described."
        />
      ) : null}

      {operation.responses.length > 0 ? (
        <div className="flex flex-col gap-1.5">
          <h4 className="text-xs font-semibold tracking-[0.08em] text-muted uppercase">Answers</h4>
          <ul className="flex flex-wrap gap-x-4 gap-y-1 text-sm">
            {operation.responses.map((response) => (
              <li key={response.status} className="flex items-baseline gap-1.5">
                <span
                  className={`tabular font-medium ${response.status.startsWith('2') ? 'text-success' : 'text-danger'}`}
                >
                  {response.status}
                </span>
                <span className="text-muted">
                  <InlineText text={response.description} />
                </span>
              </li>
            ))}
          </ul>
        </div>
      ) : null}

      <div className="flex flex-col gap-1.5">
        <div className="flex items-center justify-between gap-3">
          <h4 className="text-xs font-semibold tracking-[0.08em] text-muted uppercase">Example</h4>
          <Button
            variant="quiet"
            className="text-sm"
            aria-label={`Copy the curl example for ${operation.method.toUpperCase()} ${operation.path}`}
            onClick={() => {
              navigator.clipboard.writeText(curl).then(
                () => setCopied(true),
                () => setCopied(false),
              );
            }}
          >
            {copied ? 'Copied' : 'Copy'}
          </Button>
        </div>
        <pre className="tabular overflow-x-auto rounded-md bg-ink p-3 text-xs leading-relaxed text-paper">
          <code>{curl}</code>
        </pre>
      </div>
    </article>
  );
}

/** Descriptions mark code with backticks, as Markdown does; show it as code rather than as backticks. */
function InlineText({ text }: { text: string }) {
  const parts = text.split('`');
  return (
    <>
      {parts.map((part, index) =>
        index % 2 === 1 ? (
          // biome-ignore lint/suspicious/noArrayIndexKey: the parts of one fixed string never reorder.
          <code key={index} className="tabular text-ink">
            {part}
          </code>
        ) : (
          part
        ),
      )}
    </>
  );
}

function FieldList({ title, rows, empty }: { title: string; rows: readonly SchemaRow[]; empty?: string }) {
  return (
    <div className="flex flex-col gap-1.5">
      <h4 className="text-xs font-semibold tracking-[0.08em] text-muted uppercase">{title}</h4>
      {rows.length === 0 ? (
        <p className="text-sm text-muted">{empty}</p>
      ) : (
        <ul className="divide-y divide-line rounded-md border border-line">
          {rows.map((row) => (
            <li
              key={row.name}
              className="flex flex-col gap-0.5 px-3 py-2 text-sm md:flex-row md:items-baseline md:gap-4"
              style={{ paddingLeft: `${0.75 + row.depth * 1.25}rem` }}
            >
              <span className="flex shrink-0 items-baseline gap-2 md:w-64">
                {row.depth > 0 ? (
                  <span aria-hidden="true" className="text-line">
                    └
                  </span>
                ) : null}
                <code className="tabular font-medium break-all text-ink">{row.name.split('.').at(-1)}</code>
                {row.required ? (
                  <span className="text-xs font-semibold text-amber-ink">required</span>
                ) : (
                  <span className="text-xs text-muted">optional</span>
                )}
              </span>
              <code className="tabular shrink-0 text-slate md:w-40">{row.type}</code>
              <span className="text-muted">
                {[...row.rules, ...(row.description ? [row.description] : [])].join(' · ') || '—'}
              </span>
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}
