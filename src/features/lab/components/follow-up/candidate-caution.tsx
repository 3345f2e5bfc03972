import { Alert } from '@/components/alert';

/** The caution every candidate view carries, in the server's own words when it sent them. */
export function CandidateCaution({ cautions }: { cautions: readonly string[] }) {
  return (
    <Alert tone="note" title="Candidates are not confirmed planets">
      <ul className="flex flex-col gap-1">
        {cautions.map((caution) => (
          <li key={caution}>{caution}</li>
        ))}
      </ul>
    </Alert>
  );
}
