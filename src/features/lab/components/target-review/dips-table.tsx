import { Table, TableBody, TableHead, Td, Th, Tr } from '@/components/table';
import type { TargetDip } from '../../api/get-target';
import { formatScore } from '../../lib/snippets';
import { formatNumber } from '../../lib/targets';

interface DipsTableProps {
  dips: readonly TargetDip[];
  /** The snippet under the pointer, shared with the light curve's bands. */
  hoveredSnippet: number | null;
  onHoverSnippet: (snippetId: number | null) => void;
}

/** Dip times in the light curve's days with their σ in minutes, which is how long a transit is read. */
function formatDipTime(dip: TargetDip): string {
  const sigma = dip.timeSigma === null ? '' : ` ± ${(dip.timeSigma * 24 * 60).toFixed(0)} min`;
  return `${dip.timeCenter.toFixed(4)} d${sigma}`;
}

export function DipsTable({ dips, hoveredSnippet, onHoverSnippet }: DipsTableProps) {
  if (dips.length === 0) {
    return (
      <p className="rounded-lg border border-dashed border-edge bg-surface px-4 py-5 text-base text-muted">
        No dip has been settled on this target yet: volunteers have not found one, or its snippets are still
        open.
      </p>
    );
  }
  return (
    <Table caption="Dips volunteers found on this target">
      <TableHead>
        <Th>Dip</Th>
        <Th>Time ± error</Th>
        <Th className="text-right">Depth</Th>
        <Th className="text-right">Duration</Th>
        <Th className="text-right">SNR</Th>
        <Th className="text-right">Consensus score</Th>
        <Th>Snippet</Th>
      </TableHead>
      <TableBody>
        {dips.map((dip) => (
          <Tr
            key={dip.id}
            card="pairs"
            selected={dip.snippetId === hoveredSnippet}
            onMouseEnter={() => onHoverSnippet(dip.snippetId)}
            onMouseLeave={() => onHoverSnippet(null)}
          >
            <Td label="Dip">
              <span className="tabular font-medium text-ink">#{dip.id}</span>
            </Td>
            <Td label="Time ± error" className="col-span-2 md:col-span-1">
              <span className="tabular text-sm md:whitespace-nowrap">{formatDipTime(dip)}</span>
            </Td>
            <Td label="Depth" className="md:text-right">
              <span className="tabular">{formatNumber(dip.depthPpm, 0, 'ppm')}</span>
            </Td>
            <Td label="Duration" className="md:text-right">
              <span className="tabular">{formatNumber(dip.durationHours, 1, 'h')}</span>
            </Td>
            <Td label="SNR" className="md:text-right">
              <span className="tabular">{formatNumber(dip.snr, 1)}</span>
            </Td>
            <Td label="Consensus score" className="md:text-right">
              <span className="tabular text-amber-ink">{formatScore(dip.consensusScore)}</span>
            </Td>
            <Td label="Snippet">
              <span className="tabular">#{dip.snippetId}</span>
            </Td>
          </Tr>
        ))}
      </TableBody>
    </Table>
  );
}
