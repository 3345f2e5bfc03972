import { buttonClasses } from '@/components/button';
import { apiPaths, type ExportFormat } from '@/config/paths';

const formats: { format: ExportFormat; label: string }[] = [
  { format: 'csv', label: 'CSV' },
  { format: 'json', label: 'JSON' },
  { format: 'votable', label: 'VOTable' },
];

const exports = [
  {
    name: 'Follow-up list',
    href: apiPaths.campaignFollowUpExport,
    contains:
      'Every candidate with its ephemeris (period and mid-transit time in BJD_TDB, with errors), depth, duration, SNR, priority, state, disposition and the volunteers credited.',
  },
  {
    name: 'Consensus list',
    href: apiPaths.campaignConsensusExport,
    contains:
      'Every settled and ruled snippet with its consensus score, the dip’s time and the counts of verdicts behind it.',
  },
] as const;

/**
 * Plain links: the browser downloads them itself and sends the session cookie, so a large export
 * streams to disk instead of through the page.
 */
export function ExportLinks({ campaignId }: { campaignId: number }) {
  return (
    <section aria-labelledby="exports-heading" className="flex flex-col gap-4">
      <div className="flex flex-col gap-1">
        <h2 id="exports-heading" className="text-xl font-semibold text-ink">
          Exports
        </h2>
        <p className="max-w-2xl text-base text-muted">
          CSV for spreadsheets, JSON for scripts, VOTable 1.4 (with units and UCDs) for astronomy tools. The
          files say it too: a candidate is not a confirmed planet.
        </p>
      </div>
      <div className="grid grid-cols-1 gap-4 lg:grid-cols-2">
        {exports.map((item) => (
          <div
            key={item.name}
            className="flex flex-col gap-3 rounded-lg border border-line bg-surface p-4 md:p-5"
          >
            <h3 className="text-base font-semibold text-ink">{item.name}</h3>
            <p className="text-sm text-muted">{item.contains}</p>
            <ul className="flex flex-wrap gap-2">
              {formats.map(({ format, label }) => (
                <li key={format}>
                  <a
                    href={item.href(campaignId, format)}
                    download
                    aria-label={`${item.name} as ${label}`}
                    className={buttonClasses('secondary')}
                  >
                    <span aria-hidden="true">↓</span> {label}
                  </a>
                </li>
              ))}
            </ul>
          </div>
        ))}
      </div>
    </section>
  );
}
