import { Button } from '@/components/button';

const countFormat = new Intl.NumberFormat('en-GB');

interface PagerProps {
  /** What the pages are of, for the navigation's name and the count ("snippets"). */
  noun: string;
  page: number;
  pageSize: number;
  total: number;
  onPage: (page: number) => void;
}

/** "1–25 of 4,682 snippets" with Previous and Next, for any paginated table. */
export function Pager({ noun, page, pageSize, total, onPage }: PagerProps) {
  const lastPage = Math.max(1, Math.ceil(total / pageSize));
  const first = total === 0 ? 0 : (page - 1) * pageSize + 1;
  const last = Math.min(total, page * pageSize);
  return (
    <nav
      aria-label={`${noun[0]!.toUpperCase()}${noun.slice(1)} pages`}
      className="flex flex-wrap items-center justify-between gap-3"
    >
      <p className="text-sm text-muted">
        <span className="tabular text-ink">
          {countFormat.format(first)}–{countFormat.format(last)}
        </span>{' '}
        of <span className="tabular text-ink">{countFormat.format(total)}</span> {noun}
      </p>
      {lastPage > 1 ? (
        <div className="flex items-center gap-2">
          <Button variant="secondary" disabled={page <= 1} onClick={() => onPage(page - 1)}>
            Previous
          </Button>
          <span className="tabular px-1 text-sm text-muted">
            {page} / {lastPage}
          </span>
          <Button variant="secondary" disabled={page >= lastPage} onClick={() => onPage(page + 1)}>
            Next
          </Button>
        </div>
      ) : null}
    </nav>
  );
}
