import { useMemo } from 'react';
import type { TransitWindow } from '../../api/get-candidate-windows';
import { formatSigmaMinutes, formatUtcTime } from '../../lib/candidates';
import { calendarMonths, dayLabel, monthLabel, weekdayNames } from '../../lib/transit-calendar';
import { observabilitySummary, observableSites } from './observability';

/**
 * The windows on a month calendar in UTC, each on the day of its mid-transit. Phones get the same
 * days as a list: seven columns do not fit 375 px with anything legible in them.
 */
export function WindowsCalendar({ windows }: { windows: readonly TransitWindow[] }) {
  const months = useMemo(() => calendarMonths(windows), [windows]);
  return (
    <div className="flex flex-col gap-6">
      <p className="text-sm text-muted">
        Days are UTC; each window sits on the day of its mid-transit. Months without a window are left out.
      </p>
      {months.map((month) => (
        <section
          key={month.key}
          aria-label={monthLabel(month.year, month.month)}
          className="flex flex-col gap-3"
        >
          <h3 className="text-lg font-semibold text-ink">{monthLabel(month.year, month.month)}</h3>
          <table className="hidden w-full table-fixed border-collapse md:table">
            <caption className="sr-only">
              Transit windows in {monthLabel(month.year, month.month)}, UTC
            </caption>
            <thead>
              <tr>
                {weekdayNames.map((name) => (
                  <th
                    key={name}
                    scope="col"
                    className="pb-1 text-left text-xs font-semibold uppercase tracking-[0.08em] text-muted"
                  >
                    <abbr title={name} className="no-underline">
                      {name.slice(0, 3)}
                    </abbr>
                  </th>
                ))}
              </tr>
            </thead>
            <tbody>
              {month.weeks.map((week) => (
                <tr key={week.find((day) => day)?.date}>
                  {week.map((day, index) =>
                    day ? (
                      <td
                        key={day.date}
                        className={`h-24 border border-line p-1.5 align-top ${day.windows.length > 0 ? 'bg-surface' : 'bg-paper/60'}`}
                      >
                        <span
                          className={`tabular text-xs ${day.windows.length > 0 ? 'font-semibold text-ink' : 'text-muted'}`}
                        >
                          {day.dayOfMonth}
                        </span>
                        {day.windows.length > 0 ? (
                          <ul className="mt-1 flex flex-col gap-1">
                            {day.windows.map((window) => (
                              <CalendarEntry key={window.epoch} window={window} />
                            ))}
                          </ul>
                        ) : null}
                      </td>
                    ) : (
                      // biome-ignore lint/suspicious/noArrayIndexKey: blank cells have no identity but their place
                      <td key={`blank-${index}`} className="border border-line bg-paper/30" />
                    ),
                  )}
                </tr>
              ))}
            </tbody>
          </table>
          <ul
            aria-label={`Days with windows in ${monthLabel(month.year, month.month)}`}
            className="flex flex-col gap-3 md:hidden"
          >
            {month.busyDays.map((day) => (
              <li key={day.date} className="flex flex-col gap-2 rounded-lg border border-line bg-surface p-3">
                <h4 className="text-sm font-semibold text-ink">{dayLabel(day.date)}</h4>
                <ul className="flex flex-col gap-2">
                  {day.windows.map((window) => (
                    <DayListEntry key={window.epoch} window={window} />
                  ))}
                </ul>
              </li>
            ))}
          </ul>
        </section>
      ))}
    </div>
  );
}

function CalendarEntry({ window }: { window: TransitWindow }) {
  const observable = observableSites(window).length > 0;
  return (
    <li
      title={`Epoch ${window.epoch}: ${formatUtcTime(window.startUtc)}–${formatUtcTime(window.endUtc)} UTC. ${observabilitySummary(window)}`}
      className={`rounded-sm px-1.5 py-1 text-xs leading-tight ${observable ? 'border-l-4 border-success bg-success-wash text-ink' : 'border-l-4 border-edge bg-paper text-slate'}`}
    >
      <span className="tabular block font-medium">
        <span aria-hidden="true">{observable ? '✓ ' : '✕ '}</span>
        {formatUtcTime(window.midUtc)} mid
      </span>
      <span className="tabular block text-slate">
        {formatUtcTime(window.startUtc)}–{formatUtcTime(window.endUtc)}
      </span>
      <span className="block">{observable ? 'Observable' : 'Not observable'}</span>
      <span className="sr-only">
        Epoch {window.epoch}, mid-transit {formatUtcTime(window.midUtc)} UTC{' '}
        {formatSigmaMinutes(window.sigmaDays)}. {observabilitySummary(window)}.
      </span>
    </li>
  );
}

function DayListEntry({ window }: { window: TransitWindow }) {
  const observable = observableSites(window).length > 0;
  return (
    <li
      className={`flex flex-col gap-0.5 rounded-md border-l-4 px-3 py-2 text-sm ${observable ? 'border-success bg-success-wash' : 'border-edge bg-paper'}`}
    >
      <span className="tabular font-medium text-ink">
        <span aria-hidden="true">{observable ? '✓ ' : '✕ '}</span>
        {formatUtcTime(window.startUtc)}–{formatUtcTime(window.endUtc)} UTC · epoch {window.epoch}
      </span>
      <span className="tabular text-slate">
        Mid-transit {formatUtcTime(window.midUtc)} {formatSigmaMinutes(window.sigmaDays)}
      </span>
      <span className={observable ? 'font-medium text-success' : 'text-muted'}>
        {observabilitySummary(window)}
      </span>
    </li>
  );
}
