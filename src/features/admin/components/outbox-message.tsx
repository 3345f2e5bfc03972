import { type ReactNode, useId, useState } from 'react';
import { Link } from 'react-router-dom';
import { Alert } from '@/components/alert';
import { ButtonLink } from '@/components/button';
import { LoadFailure } from '@/components/load-failure';
import { Loading } from '@/components/loading';
import { MailFrame } from '@/components/mail-frame';
import { PageHeader } from '@/components/page-header';
import { Table, TableBody, TableHead, Td, Th, Tr } from '@/components/table';
import { ViewSwitch } from '@/components/view-switch';
import { paths } from '@/config/paths';
import { isApiError } from '@/lib/api-client';
import { useOutboxMessage } from '../api/get-outbox-message';
import { defaultView, formatSize, type OutboxMessage, type OutboxView, recipientsText } from '../lib/outbox';
import { formatReceived } from './outbox-admin';

const viewLabels: Record<OutboxView, string> = { html: 'HTML', text: 'Plain text', headers: 'Headers' };

export function OutboxMessagePage({ messageId }: { messageId: number }) {
  const message = useOutboxMessage(messageId);
  const back = (
    <Link
      to={paths.adminOutbox.getHref()}
      className="inline-flex min-h-target items-center gap-1 text-base font-medium text-ink underline underline-offset-4"
    >
      <span aria-hidden="true">←</span> Back to the outbox
    </Link>
  );

  if (message.isPending) return <Loading label="Opening the message…" />;
  if (message.isError) {
    const missing = isApiError(message.error) && message.error.status === 404;
    return (
      <div className="flex flex-col gap-4">
        {back}
        {missing ? (
          <Alert tone="danger" title="No such message">
            <p>The outbox holds no message with this number.</p>
            <ButtonLink variant="secondary" className="mt-2" to={paths.adminOutbox.getHref()}>
              Open the outbox
            </ButtonLink>
          </Alert>
        ) : (
          <LoadFailure
            title="Could not open the message"
            error={message.error}
            onRetry={() => message.refetch()}
          />
        )}
      </div>
    );
  }
  return (
    <div className="flex flex-col gap-6">
      {back}
      <MessageView message={message.data} />
    </div>
  );
}

function MessageView({ message }: { message: OutboxMessage }) {
  const [view, setView] = useState<OutboxView>(() => defaultView(message));
  const panelId = useId();

  return (
    <>
      <PageHeader eyebrow="Admin · Outbox" title={message.subject || '(no subject)'} />
      <dl className="grid gap-x-6 gap-y-3 rounded-lg border border-line bg-surface p-5 sm:grid-cols-2">
        <Meta term="From">{message.from}</Meta>
        <Meta term="To">{recipientsText(message.to)}</Meta>
        <Meta term="Received">
          <time dateTime={message.receivedAt}>{formatReceived(message.receivedAt)}</time>
        </Meta>
        <Meta term="Size">{formatSize(message.sizeBytes)}</Meta>
        {message.messageId ? (
          <div className="sm:col-span-2">
            <Meta term="Message-ID">{message.messageId}</Meta>
          </div>
        ) : null}
      </dl>

      <section aria-label="Message content" className="flex flex-col gap-4">
        <ViewSwitch
          legend="Show the message as"
          labels={viewLabels}
          value={view}
          onChange={setView}
          controls={panelId}
        />
        <div id={panelId}>
          {view === 'html' ? <HtmlView message={message} /> : null}
          {view === 'text' ? <TextView message={message} /> : null}
          {view === 'headers' ? <HeadersView message={message} /> : null}
        </div>
      </section>
    </>
  );
}

function Meta({ term, children }: { term: string; children: ReactNode }) {
  return (
    <div className="flex min-w-0 flex-col gap-0.5">
      <dt className="text-sm font-medium text-muted">{term}</dt>
      <dd className="text-base break-all text-ink">{children}</dd>
    </div>
  );
}

function HtmlView({ message }: { message: OutboxMessage }) {
  if (message.html === null) {
    return <p className="text-base text-muted">This message has no HTML part; see its plain text.</p>;
  }
  return (
    <div className="flex flex-col gap-2">
      <p className="text-sm text-muted">
        Links and images are not loaded here, and no script runs, so opening a message tells no one it was
        read.
      </p>
      <MailFrame
        html={message.html}
        title={`The HTML of “${message.subject || 'a message without subject'}”`}
        className="h-[36rem]"
      />
    </div>
  );
}

function TextView({ message }: { message: OutboxMessage }) {
  if (message.text === null) {
    return <p className="text-base text-muted">This message has no plain-text part; see its HTML.</p>;
  }
  return (
    <pre className="overflow-x-auto rounded-lg border border-line bg-surface p-5 font-mono text-sm whitespace-pre-wrap break-words text-ink">
      {message.text}
    </pre>
  );
}

function HeadersView({ message }: { message: OutboxMessage }) {
  return (
    <Table caption="The message's header lines, in the order it carries them">
      <TableHead>
        <Th>Header</Th>
        <Th>Value</Th>
      </TableHead>
      <TableBody>
        {message.headers.map((header, index) => (
          // Headers repeat (Received, for one), so the position is part of what names a row.
          // biome-ignore lint/suspicious/noArrayIndexKey: the list never reorders
          <Tr key={`${index}-${header.key}`} align="top">
            <Td label="Header" className="font-mono text-sm font-medium whitespace-nowrap text-ink">
              {header.key}
            </Td>
            <Td label="Value" card="block" className="font-mono text-sm break-all text-slate">
              {header.value}
            </Td>
          </Tr>
        ))}
      </TableBody>
    </Table>
  );
}
