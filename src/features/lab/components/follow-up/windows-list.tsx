import type { TransitWindow } from '../../api/get-candidate-windows';
import {
  formatBjd,
  formatDegrees,
  formatSigmaMinutes,
  formatUtc,
  formatUtcRange,
} from '../../lib/candidates';
import { ObservableMark } from './observability';

/** The next transit windows, one card each, with times in BJD_TDB and UTC and each observatory's say. */
export function WindowsList({ windows }: { windows: readonly TransitWindow[] }) {
  return (
    <ol aria-label="Transit windows" className="flex flex-col gap-4">
      {windows.map((window) => (
        <li
          key={window.epoch}
          id={`epoch-${window.epoch}`}
          aria-label={`Epoch ${window.epoch}`}
          className="flex flex-col gap-3 rounded-lg border border-line bg-surface p-4 md:p-5"
        >
          <div className="flex flex-wrap items-baseline justify-between gap-x-4 gap-y-1">
            <h3 className="flex flex-col text-base font-semibold text-ink sm:flex-row sm:gap-1.5">
              <span className="tabular text-amber-ink">Epoch {window.epoch}</span>
              <span aria-hidden="true" className="hidden sm:inline">
                ·
              </span>
              <span>{formatUtc(window.midUtc)}</span>
            </h3>
            <p className="tabular text-sm text-slate">Mid-transit {formatSigmaMinutes(window.sigmaDays)}</p>
          </div>
          <dl className="grid grid-cols-1 gap-x-6 gap-y-2 text-sm md:grid-cols-2 xl:grid-cols-4">
            <div className="flex flex-col">
              <dt className="text-xs font-semibold uppercase tracking-[0.08em] text-muted">
                Mid-transit BJD_TDB
              </dt>
              <dd className="tabular text-ink">
                {formatBjd(window.midBjdTdb)} {formatSigmaMinutes(window.sigmaDays)}
              </dd>
            </div>
            <div className="flex flex-col">
              <dt className="text-xs font-semibold uppercase tracking-[0.08em] text-muted">Window BJD_TDB</dt>
              <dd className="tabular text-ink">
                {formatBjd(window.startBjdTdb)} – {formatBjd(window.endBjdTdb)}
              </dd>
            </div>
            <div className="flex flex-col">
              <dt className="text-xs font-semibold uppercase tracking-[0.08em] text-muted">Window UTC</dt>
              <dd className="tabular text-ink">{formatUtcRange(window.startUtc, window.endUtc)}</dd>
            </div>
            <div className="flex flex-col">
              <dt className="text-xs font-semibold uppercase tracking-[0.08em] text-muted">Sun separation</dt>
              <dd className="tabular text-ink">{formatDegrees(window.sunSeparationDeg)}</dd>
            </div>
          </dl>
          {window.observatories.length > 0 ? (
            <ul
              aria-label={`Observatories for epoch ${window.epoch}`}
              className="flex flex-col divide-y divide-line rounded-md border border-line"
            >
              {window.observatories.map((site) => (
                <li
                  key={site.observatoryId}
                  className={`flex flex-col gap-1 px-3 py-2 text-sm md:flex-row md:items-baseline md:gap-4 ${site.observable ? 'bg-success-wash/50' : ''}`}
                >
                  <span className="font-medium text-ink md:w-48 md:shrink-0">{site.name}</span>
                  <span className="md:w-36 md:shrink-0">
                    <ObservableMark observable={site.observable} />
                  </span>
                  <span className="text-muted">{site.reason}</span>
                </li>
              ))}
            </ul>
          ) : null}
        </li>
      ))}
    </ol>
  );
}
