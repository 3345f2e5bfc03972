import { Link } from 'react-router-dom';
import { type DeskQueueHref, paths } from '@/config/paths';
import { formatHours, formatScore } from '../lib/format';
import { type Neighbour, type SnippetState, snippetStateLabels } from '../lib/splits';

const stateStyles: Record<SnippetState, string> = {
  open: 'border-edge bg-surface',
  settled: 'border-success bg-success-wash',
  split: 'border-danger bg-danger-wash',
  ruled: 'border-amber bg-amber-wash',
};

const stateText: Record<SnippetState, string> = {
  open: 'text-ink',
  settled: 'text-success',
  split: 'text-danger',
  ruled: 'text-amber-ink',
};

interface NeighbourStripProps {
  snippetId: number;
  neighbours: readonly Neighbour[];
  queue: DeskQueueHref;
}

/** The snippets cut from the same light curve, in time order around this one, each with its state and score. */
export function NeighbourStrip({ snippetId, neighbours, queue }: NeighbourStripProps) {
  const items = [...neighbours].sort((a, b) => a.offsetHours - b.offsetHours);
  const before = items.filter((item) => item.offsetHours < 0);
  const after = items.filter((item) => item.offsetHours >= 0);

  return (
    <section aria-labelledby="desk-neighbours-heading" className="flex min-w-0 flex-col gap-3">
      <h2 id="desk-neighbours-heading" className="text-lg font-semibold text-ink">
        Neighbouring snippets
      </h2>
      {items.length === 0 ? (
        <p className="rounded-lg border border-dashed border-edge bg-surface px-4 py-4 text-base text-muted">
          No other snippet was cut from this light curve.
        </p>
      ) : (
        <>
          <ol className="flex flex-wrap gap-2" aria-label="Snippets of the same light curve, in time order">
            {before.map((item) => (
              <NeighbourLink key={item.snippetId} item={item} queue={queue} />
            ))}
            <li>
              <span
                aria-current="true"
                className="flex min-h-target min-w-24 flex-col justify-center rounded-md border-2 border-ink bg-ink px-3 py-1 text-paper"
              >
                <span className="tabular text-xs">0 h · #{snippetId}</span>
                <span className="text-sm font-medium">This snippet</span>
              </span>
            </li>
            {after.map((item) => (
              <NeighbourLink key={item.snippetId} item={item} queue={queue} />
            ))}
          </ol>
          <p className="text-xs text-muted">
            Each shows its start relative to this snippet, its state and consensus score.
          </p>
        </>
      )}
    </section>
  );
}

function NeighbourLink({ item, queue }: { item: Neighbour; queue: DeskQueueHref }) {
  const offset = `${item.offsetHours > 0 ? '+' : ''}${formatHours(item.offsetHours, 0)}`;
  const outcome = item.outcome ? ` (${item.outcome})` : '';
  return (
    <li>
      <Link
        to={paths.deskSplit.getHref(item.snippetId, queue)}
        aria-label={`Snippet ${item.snippetId}, ${offset} from this one: ${snippetStateLabels[item.state].toLowerCase()}${outcome}, consensus score ${formatScore(item.consensusScore)}`}
        className={`flex min-h-target min-w-24 flex-col justify-center rounded-md border px-3 py-1 hover:border-ink ${stateStyles[item.state]}`}
      >
        <span className="tabular text-xs text-ink">
          {offset} · #{item.snippetId}
        </span>
        <span className={`text-sm font-medium ${stateText[item.state]}`}>
          {snippetStateLabels[item.state]}
          {outcome} <span className="tabular font-normal">{formatScore(item.consensusScore)}</span>
        </span>
      </Link>
    </li>
  );
}
