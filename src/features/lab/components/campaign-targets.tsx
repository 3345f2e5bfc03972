import { useEffect, useId, useState } from 'react';
import { Link } from 'react-router-dom';
import { Badge } from '@/components/badge';
import { LoadFailure } from '@/components/load-failure';
import { Loading } from '@/components/loading';
import { Pager } from '@/components/pager';
import { Table, TableBody, TableHead, Td, Th, Tr } from '@/components/table';
import { inputClasses } from '@/components/text-field';
import { paths } from '@/config/paths';
import { useTargets } from '../api/get-targets';
import { formatCount } from '../lib/format';
import { fieldLabel, formatDec, formatNumber, formatRa, type Target } from '../lib/targets';

const pageSize = 20;
const searchDelayMs = 250;

export function CampaignTargets({ campaignId }: { campaignId: number }) {
  const searchId = useId();
  const [search, setSearch] = useState('');
  const [q, setQ] = useState('');
  const [page, setPage] = useState(1);

  // Typing should not fire one request per key.
  useEffect(() => {
    const timer = window.setTimeout(() => {
      setQ(search);
      setPage(1);
    }, searchDelayMs);
    return () => window.clearTimeout(timer);
  }, [search]);

  return (
    <div className="flex flex-col gap-4">
      <div className="flex flex-col gap-1.5 md:max-w-sm">
        <label htmlFor={searchId} className="text-sm font-medium">
          Find a target
        </label>
        <input
          id={searchId}
          type="search"
          value={search}
          onChange={(event) => setSearch(event.target.value)}
          placeholder="Designation"
          className={`${inputClasses} tabular`}
        />
      </div>
      <TargetTable campaignId={campaignId} q={q} page={page} onPage={setPage} />
    </div>
  );
}

function TargetTable({
  campaignId,
  q,
  page,
  onPage,
}: {
  campaignId: number;
  q: string;
  page: number;
  onPage: (page: number) => void;
}) {
  const targets = useTargets({ campaignId, q, page, pageSize });

  if (targets.isPending) return <Loading label="Loading targets…" />;
  if (targets.isError) {
    return (
      <LoadFailure
        title="Could not load the targets"
        error={targets.error}
        onRetry={() => targets.refetch()}
      />
    );
  }
  const { total } = targets.data;
  if (targets.data.targets.length === 0) {
    return (
      <p className="rounded-lg border border-dashed border-edge bg-surface px-4 py-5 text-base text-muted">
        {q
          ? `No target’s designation contains “${q}”.`
          : 'No targets yet. Upload a catalogue above; light curves can only be read for stars in it.'}
      </p>
    );
  }

  return (
    <div className="flex flex-col gap-3" aria-busy={targets.isFetching || undefined}>
      <Table caption="Targets in this campaign">
        <TableHead>
          <Th>Target</Th>
          <Th>RA</Th>
          <Th>Dec</Th>
          <Th className="text-right">Mag</Th>
          <Th>Star</Th>
          <Th className="text-right">Light curves</Th>
          <Th className="text-right">Snippets</Th>
        </TableHead>
        <TableBody>
          {targets.data.targets.map((target) => (
            <TargetRow key={target.id} target={target} />
          ))}
        </TableBody>
      </Table>
      <Pager noun="targets" page={targets.data.page} pageSize={pageSize} total={total} onPage={onPage} />
    </div>
  );
}

function TargetRow({ target }: { target: Target }) {
  const assumed = new Set(target.assumedFields);
  return (
    <Tr card="pairs">
      <Td label="Target" className="col-span-2 before:hidden">
        <Link
          to={paths.labTarget.getHref(target.id)}
          className="tabular flex min-h-target items-center rounded-sm font-medium text-ink underline decoration-line decoration-2 underline-offset-4 hover:decoration-amber"
        >
          {target.designation}
        </Link>
      </Td>
      <Td label="RA">
        <span className="tabular text-sm text-slate md:whitespace-nowrap">{formatRa(target.raDeg)}</span>
      </Td>
      <Td label="Dec">
        <span className="tabular text-sm text-slate md:whitespace-nowrap">{formatDec(target.decDeg)}</span>
      </Td>
      <Td label="Mag" className="md:text-right">
        <span className="tabular text-slate">{formatNumber(target.magnitude, 2)}</span>
      </Td>
      <Td label="Star" className="col-span-2">
        <span className="flex flex-wrap items-center justify-end gap-1.5 md:justify-start">
          <span className="tabular text-sm text-slate md:whitespace-nowrap">
            {formatNumber(target.stellarRadiusRsun, 2, 'R☉')} · {formatNumber(target.teffK, 0, 'K')}
          </span>
          {assumed.size > 0 ? (
            <span title={`Assumed: ${target.assumedFields.map(fieldLabel).join(', ')}`}>
              <Badge tone="amber">assumed</Badge>
            </span>
          ) : null}
        </span>
      </Td>
      <Td label="Light curves" className="md:text-right">
        <span className="tabular text-ink">{formatCount(target.lightCurveCount)}</span>
      </Td>
      <Td label="Snippets" className="md:text-right">
        <span className="tabular text-ink">{formatCount(target.snippetCount)}</span>
      </Td>
    </Tr>
  );
}
