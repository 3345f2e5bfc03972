import { Badge } from '@/components/badge';
import { Table, TableBody, TableHead, Td, Th, Tr } from '@/components/table';
import { formatHours, formatShare, formatWeight } from '../lib/format';
import { answerLabels, answerTones, type ReviewVerdict, verdictAnswers } from '../lib/splits';

/** Every verdict on the snippet, by name (moderators only), with the reliability behind its weight. */
export function VerdictTable({ verdicts }: { verdicts: readonly ReviewVerdict[] }) {
  const counts = verdictAnswers.map((answer) => ({
    answer,
    count: verdicts.filter((verdict) => verdict.answer === answer).length,
  }));
  const marks = verdicts.filter((verdict) => verdict.markHours !== null).length;

  return (
    <section aria-labelledby="desk-verdicts-heading" className="flex flex-col gap-3">
      <div className="flex flex-wrap items-baseline justify-between gap-x-4 gap-y-1">
        <h2 id="desk-verdicts-heading" className="text-lg font-semibold text-ink">
          Verdicts
        </h2>
        <p className="tabular text-sm text-muted">
          {counts.map(({ answer, count }) => `${count} ${answerLabels[answer].toLowerCase()}`).join(' · ')} ·{' '}
          {marks} {marks === 1 ? 'mark' : 'marks'}
        </p>
      </div>
      <p className="max-w-3xl text-sm text-muted">
        Weight is the log-odds a verdict added to the consensus score: positive towards a dip, negative
        towards flat. It follows from the volunteer’s sensitivity (says dip on dips) and specificity (says
        flat on quiet data); unsure adds nothing.
      </p>
      {verdicts.length === 0 ? (
        <p className="rounded-lg border border-dashed border-edge bg-surface px-4 py-4 text-base text-muted">
          No verdict counts on this snippet.
        </p>
      ) : (
        <Table caption="Verdicts on this snippet, with each volunteer’s reliability and the weight it gave">
          <TableHead>
            <Th>Volunteer</Th>
            <Th>Answer</Th>
            <Th className="text-right">Mark</Th>
            <Th className="text-right">Sensitivity</Th>
            <Th className="text-right">Specificity</Th>
            <Th className="text-right">Weight</Th>
          </TableHead>
          <TableBody>
            {verdicts.map((verdict) => (
              <Tr key={verdict.personId} card="pairs">
                <Td label="Volunteer" className="col-span-2">
                  <span className="flex flex-wrap items-center justify-end gap-2 md:justify-start">
                    <span className="font-medium text-ink">{verdict.displayName}</span>
                    {verdict.suspended ? <Badge tone="danger">Suspended: not counted</Badge> : null}
                  </span>
                </Td>
                <Td label="Answer">
                  <Badge tone={answerTones[verdict.answer]}>{answerLabels[verdict.answer]}</Badge>
                </Td>
                <Td label="Mark" className="md:text-right">
                  <span className={`tabular ${verdict.markHours === null ? 'text-muted' : 'text-amber-ink'}`}>
                    {formatHours(verdict.markHours, 2)}
                  </span>
                </Td>
                <Td label="Sensitivity" className="md:text-right">
                  <span className="tabular text-slate">{formatShare(verdict.sensitivity)}</span>
                </Td>
                <Td label="Specificity" className="md:text-right">
                  <span className="tabular text-slate">{formatShare(verdict.specificity)}</span>
                </Td>
                <Td label="Weight" className="md:text-right">
                  <span
                    className={`tabular font-medium ${
                      verdict.weight > 0 ? 'text-amber-ink' : verdict.weight < 0 ? 'text-slate' : 'text-muted'
                    }`}
                  >
                    {formatWeight(verdict.weight)}
                  </span>
                </Td>
              </Tr>
            ))}
          </TableBody>
        </Table>
      )}
    </section>
  );
}
