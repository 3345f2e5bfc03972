import type { ReactNode } from 'react';
import { Alert } from '@/components/alert';
import { ButtonLink } from '@/components/button';
import { EmptyState } from '@/components/empty-state';
import { Loading } from '@/components/loading';
import { Table, TableBody, TableHead, Td, Th, Tr } from '@/components/table';
import { paths } from '@/config/paths';
import { type MyRecord, useRecord } from '../api/get-record';

/** Controls of a kind a person must have seen before their accuracy on them is shown (the server's rule). */
const controlsBeforeAccuracy = 5;

const whenFormat = new Intl.DateTimeFormat('en-GB', {
  day: 'numeric',
  month: 'short',
  hour: '2-digit',
  minute: '2-digit',
});

function formatWhen(iso: string): string {
  const date = new Date(iso);
  return Number.isNaN(date.getTime()) ? iso : whenFormat.format(date);
}

function percent(share: number): string {
  return `${Math.round(share * 100)} %`;
}

// The server sends twenty; ten keep the page short on a phone, where each row becomes a card.
const recentShown = 10;

const answerTones: Record<string, string> = { dip: 'text-amber-ink', flat: 'text-slate', unsure: 'text-ink' };

/** What a person has done in the Deck: their verdicts, accuracy on controls, and what came of them. */
export function RecordSummary() {
  const record = useRecord();
  if (record.isPending) return <Loading label="Reading your record…" />;
  if (record.isError) {
    return (
      <Alert tone="danger" title="Could not read your record">
        {record.error.message}
      </Alert>
    );
  }
  const data = record.data;
  if (data.verdicts.total === 0) {
    return (
      <EmptyState
        title="No verdicts yet"
        upcoming={[
          'Every verdict you give in the Deck',
          'Your accuracy on controls, the snippets whose answer is known',
          'Dips and candidates credited to you',
        ]}
        action={<ButtonLink to={paths.deck.getHref()}>Open the Deck</ButtonLink>}
      >
        <p>Judge your first snippets and your record builds up here.</p>
      </EmptyState>
    );
  }
  return (
    <div className="flex flex-col gap-6">
      <section aria-labelledby="numbers-heading" className="flex flex-col gap-3">
        <h2 id="numbers-heading" className="text-lg font-semibold">
          Your verdicts
        </h2>
        <dl className="grid grid-cols-2 gap-3 md:grid-cols-4">
          <Figure term="Verdicts" value={String(data.verdicts.total)}>
            <span className="text-amber-ink">{data.verdicts.dip} dip</span> ·{' '}
            <span className="text-slate">{data.verdicts.flat} flat</span> · {data.verdicts.unsure} unsure
          </Figure>
          <Figure term="Last 30 days" value={String(data.verdicts.last30Days)}>
            verdicts
          </Figure>
          <Figure term="Dips you helped settle" value={String(data.dipsHelped)}>
            dips found on snippets you said dip to
          </Figure>
          <Figure term="Candidates credited" value={String(data.candidatesCredited)}>
            targets promoted with your dips
          </Figure>
        </dl>
      </section>
      <Accuracy controls={data.controls} />
      <Recent recent={data.recent} />
    </div>
  );
}

function Figure({ term, value, children }: { term: string; value: string; children: ReactNode }) {
  return (
    <div className="flex flex-col gap-1 rounded-lg border border-line bg-surface p-4">
      <dt className="text-sm font-medium text-muted">{term}</dt>
      <dd className="tabular text-2xl font-medium text-ink">{value}</dd>
      <dd className="text-xs text-muted">{children}</dd>
    </div>
  );
}

function Accuracy({ controls }: { controls: MyRecord['controls'] }) {
  return (
    <section
      aria-labelledby="accuracy-heading"
      className="flex flex-col gap-3 rounded-lg border border-line bg-surface p-5"
    >
      <h2 id="accuracy-heading" className="text-lg font-semibold">
        Accuracy on controls
      </h2>
      <p className="text-sm text-muted">
        Some cards are controls whose answer is known: planted ones hold a dip we added, quiet ones hold none.
        How you do on them sets how much your verdicts weigh.
      </p>
      <dl className="grid gap-3 md:grid-cols-2">
        <AccuracyFigure
          term="Planted dips found (sensitivity)"
          share={controls.sensitivity}
          counted={`${controls.plantedFound} of ${controls.plantedSeen} planted`}
          seen={controls.plantedSeen}
        />
        <AccuracyFigure
          term="Quiet cards called flat (specificity)"
          share={controls.specificity}
          counted={`${controls.quietCorrect} of ${controls.quietSeen} quiet`}
          seen={controls.quietSeen}
        />
      </dl>
    </section>
  );
}

function AccuracyFigure({
  term,
  share,
  counted,
  seen,
}: {
  term: string;
  share: number | null;
  counted: string;
  seen: number;
}) {
  return (
    <div className="flex flex-col gap-1 rounded-md bg-paper p-4">
      <dt className="text-sm font-medium text-muted">{term}</dt>
      <dd className="tabular text-2xl font-medium text-ink">{share === null ? '—' : percent(share)}</dd>
      <dd className="text-xs text-muted">
        {share === null
          ? `Shown after ${controlsBeforeAccuracy} controls of this kind; you have seen ${seen}.`
          : counted}
      </dd>
    </div>
  );
}

function Recent({ recent }: { recent: MyRecord['recent'] }) {
  return (
    <section aria-labelledby="recent-heading" className="flex flex-col gap-3">
      <h2 id="recent-heading" className="text-lg font-semibold">
        Recent verdicts
      </h2>
      <Table caption="Your recent verdicts, newest first">
        <TableHead>
          <Th>When</Th>
          <Th>Verdict</Th>
          <Th>Star</Th>
          <Th>Campaign</Th>
        </TableHead>
        <TableBody>
          {recent.slice(0, recentShown).map((verdict) => (
            <Tr key={`${verdict.snippetId}-${verdict.at}`} card="pairs">
              <Td label="When" className="tabular text-sm text-slate">
                {formatWhen(verdict.at)}
              </Td>
              <Td label="Verdict" className={`font-semibold ${answerTones[verdict.answer] ?? 'text-ink'}`}>
                {verdict.answer}
              </Td>
              <Td label="Star" className="tabular text-sm">
                {verdict.designation ?? '—'}
              </Td>
              <Td label="Campaign" className="text-sm text-muted">
                {verdict.campaignName}
              </Td>
            </Tr>
          ))}
        </TableBody>
      </Table>
    </section>
  );
}
