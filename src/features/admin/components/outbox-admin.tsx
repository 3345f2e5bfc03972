import { Link } from 'react-router-dom';
import { EmptyState } from '@/components/empty-state';
import { LoadFailure } from '@/components/load-failure';
import { Loading } from '@/components/loading';
import { PageHeader } from '@/components/page-header';
import { Pager } from '@/components/pager';
import { Table, TableBody, TableHead, Td, Th, Tr } from '@/components/table';
import { paths } from '@/config/paths';
import { useOutbox } from '../api/get-outbox';
import { formatSize, recipientsText } from '../lib/outbox';

export const outboxPageSize = 50;

const receivedFormat = new Intl.DateTimeFormat('en-GB', {
  day: 'numeric',
  month: 'short',
  year: 'numeric',
  hour: '2-digit',
  minute: '2-digit',
  second: '2-digit',
});

export function formatReceived(iso: string): string {
  const date = new Date(iso);
  return Number.isNaN(date.getTime()) ? iso : receivedFormat.format(date);
}

interface OutboxAdminProps {
  page: number;
  onPage: (page: number) => void;
}

/** Every message the local mail catcher received, newest first: what Dipdeck would have sent. */
export function OutboxAdmin({ page, onPage }: OutboxAdminProps) {
  const outbox = useOutbox({ limit: outboxPageSize, offset: (page - 1) * outboxPageSize });

  return (
    <div className="flex flex-col gap-8">
      <PageHeader
        eyebrow="Admin"
        title="Outbox"
        description="The mail Dipdeck sent: address confirmations, password resets and newsletters, as the local mail catcher received them. Open one to see it as its reader would."
      />
      <OutboxBody outbox={outbox} page={page} onPage={onPage} />
    </div>
  );
}

function OutboxBody({ outbox, page, onPage }: OutboxAdminProps & { outbox: ReturnType<typeof useOutbox> }) {
  if (outbox.isPending) return <Loading label="Loading the outbox…" />;
  if (outbox.isError) {
    return (
      <LoadFailure title="Could not load the outbox" error={outbox.error} onRetry={() => outbox.refetch()} />
    );
  }
  const { messages, total } = outbox.data;
  if (total === 0) {
    return (
      <EmptyState
        title="No mail has been sent yet"
        upcoming={['Address confirmations and password resets', 'Newsletters, one message per reader']}
      >
        <p>No mail has been sent yet. Dipdeck keeps every message its local mail catcher receives here.</p>
      </EmptyState>
    );
  }
  return (
    <section aria-labelledby="outbox-heading" className="flex flex-col gap-4">
      <h2 id="outbox-heading" className="sr-only">
        Messages
      </h2>
      {messages.length === 0 ? (
        <p className="text-base text-muted">This page is past the last message.</p>
      ) : (
        <Table caption="Messages the mail catcher received, newest first">
          <TableHead>
            <Th>Subject</Th>
            <Th>From</Th>
            <Th>To</Th>
            <Th>Received</Th>
            <Th className="text-right">Size</Th>
          </TableHead>
          <TableBody>
            {messages.map((message) => (
              <Tr key={message.id}>
                <Td label="Subject" card="block" className="min-w-0">
                  <Link
                    to={paths.adminOutboxMessage.getHref(message.id)}
                    className="flex min-h-target items-center font-medium text-ink underline-offset-4 hover:underline"
                  >
                    {message.subject || '(no subject)'}
                  </Link>
                </Td>
                <Td label="From" className="text-sm wrap-anywhere text-slate">
                  {message.from}
                </Td>
                <Td label="To" className="text-sm wrap-anywhere text-slate">
                  {recipientsText(message.to)}
                </Td>
                <Td label="Received" className="tabular text-sm whitespace-nowrap text-slate">
                  <time dateTime={message.receivedAt}>{formatReceived(message.receivedAt)}</time>
                </Td>
                <Td label="Size" className="tabular text-sm whitespace-nowrap text-slate md:text-right">
                  {formatSize(message.sizeBytes)}
                </Td>
              </Tr>
            ))}
          </TableBody>
        </Table>
      )}
      <Pager noun="messages" page={page} pageSize={outboxPageSize} total={total} onPage={onPage} />
    </section>
  );
}
