import type { ReactNode } from 'react';
import { Badge } from '@/components/badge';
import { PageHeader } from '@/components/page-header';
import { type Person, roleLabels } from '@/lib/person';
import { DeleteAccount } from './delete-account';
import { EmailPreferences } from './email-preferences';
import { RecordSummary } from './record-summary';

const joinedFormat = new Intl.DateTimeFormat('en-GB', { day: 'numeric', month: 'short', year: 'numeric' });

function formatJoined(createdAt: string): string {
  const date = new Date(createdAt);
  return Number.isNaN(date.getTime()) ? createdAt : joinedFormat.format(date);
}

interface RecordPageProps {
  person: Person;
  /** After the account is deleted and its session ended on the server. */
  onAccountDeleted: () => void;
}

export function RecordPage({ person, onAccountDeleted }: RecordPageProps) {
  return (
    <div className="flex flex-col gap-8">
      <PageHeader
        eyebrow="My record"
        title={person.displayName}
        description="Your verdicts, how you do on controls, the dips you helped find, and your account."
      />

      <div className="grid gap-6 lg:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]">
        <div className="min-w-0">
          <RecordSummary />
        </div>
        <div className="flex flex-col gap-6 self-start">
          <section aria-labelledby="account-heading" className="rounded-lg border border-line bg-surface">
            <h2 id="account-heading" className="border-b border-line px-5 py-4 text-lg font-semibold">
              Account
            </h2>
            <dl className="divide-y divide-line">
              <Row term="Display name">{person.displayName}</Row>
              <Row term="E-mail">
                <span className="flex flex-col items-end gap-0.5 text-right">
                  <span className="break-all">{person.email}</span>
                  {!person.emailConfirmed ? <Badge tone="amber">Not confirmed</Badge> : null}
                </span>
              </Row>
              <Row term="Role">
                <Badge tone="amber">{roleLabels[person.role]}</Badge>
              </Row>
              <Row term="Newsletter">
                {person.newsletterOptIn ? (
                  <span className="flex flex-col items-end gap-0.5 text-right">
                    <Badge tone="success">Opted in</Badge>
                    <span className="text-sm text-muted">You get the occasional newsletter.</span>
                  </span>
                ) : (
                  <span className="flex flex-col items-end gap-0.5 text-right">
                    <Badge tone="slate">Not opted in</Badge>
                    <span className="text-sm text-muted">We send you no newsletter.</span>
                  </span>
                )}
              </Row>
              <Row term="Member since">
                <span className="tabular text-sm text-slate">{formatJoined(person.createdAt)}</span>
              </Row>
            </dl>
          </section>
          <EmailPreferences person={person} />
          <DeleteAccount onDeleted={onAccountDeleted} />
        </div>
      </div>
    </div>
  );
}

function Row({ term, children }: { term: string; children: ReactNode }) {
  return (
    <div className="flex items-center justify-between gap-4 px-5 py-3.5">
      <dt className="text-sm font-medium text-muted">{term}</dt>
      <dd className="text-right text-base text-ink">{children}</dd>
    </div>
  );
}
