/**
 * Transit windows laid out as a calendar, in UTC: observers plan in UTC and a window must not move to
 * another day because of the reader's own time zone. A window belongs to the UTC day of its
 * mid-transit.
 */

export interface CalendarDay<T> {
  /** "2026-12-03" */
  date: string;
  dayOfMonth: number;
  windows: T[];
}

export interface CalendarMonth<T> {
  /** "2026-12" */
  key: string;
  year: number;
  /** 1 to 12. */
  month: number;
  /** Weeks from Monday to Sunday; null where a week reaches into the month before or after. */
  weeks: (CalendarDay<T> | null)[][];
  /** The days with at least one window, in order. */
  busyDays: CalendarDay<T>[];
}

/** The UTC calendar day of an instant, "YYYY-MM-DD". */
export function utcDayKey(iso: string): string {
  return new Date(iso).toISOString().slice(0, 10);
}

function daysInMonth(year: number, month: number): number {
  return new Date(Date.UTC(year, month, 0)).getUTCDate();
}

/** 0 for Monday to 6 for Sunday. */
function weekdayFromMonday(year: number, month: number, day: number): number {
  return (new Date(Date.UTC(year, month - 1, day)).getUTCDay() + 6) % 7;
}

/** The windows by UTC day of mid-transit, days in order and windows in order within a day. */
export function windowsByDay<T extends { midUtc: string }>(windows: readonly T[]): CalendarDay<T>[] {
  const days = new Map<string, T[]>();
  const sorted = [...windows].sort((a, b) => Date.parse(a.midUtc) - Date.parse(b.midUtc));
  for (const window of sorted) {
    const key = utcDayKey(window.midUtc);
    const list = days.get(key);
    if (list) list.push(window);
    else days.set(key, [window]);
  }
  return [...days].map(([date, list]) => ({ date, dayOfMonth: Number(date.slice(8, 10)), windows: list }));
}

/**
 * Month grids for the months that hold at least one window, in order. Months with no window between
 * two that have one are left out: a long period would otherwise fill the page with empty months.
 */
export function calendarMonths<T extends { midUtc: string }>(windows: readonly T[]): CalendarMonth<T>[] {
  const byMonth = new Map<string, CalendarDay<T>[]>();
  for (const day of windowsByDay(windows)) {
    const key = day.date.slice(0, 7);
    const list = byMonth.get(key);
    if (list) list.push(day);
    else byMonth.set(key, [day]);
  }
  return [...byMonth].map(([key, busyDays]) => {
    const year = Number(key.slice(0, 4));
    const month = Number(key.slice(5, 7));
    const busy = new Map(busyDays.map((day) => [day.dayOfMonth, day]));
    const cells: (CalendarDay<T> | null)[] = Array.from(
      { length: weekdayFromMonday(year, month, 1) },
      () => null,
    );
    const length = daysInMonth(year, month);
    for (let day = 1; day <= length; day += 1) {
      cells.push(
        busy.get(day) ?? {
          date: `${key}-${String(day).padStart(2, '0')}`,
          dayOfMonth: day,
          windows: [],
        },
      );
    }
    while (cells.length % 7 !== 0) cells.push(null);
    const weeks: (CalendarDay<T> | null)[][] = [];
    for (let start = 0; start < cells.length; start += 7) weeks.push(cells.slice(start, start + 7));
    return { key, year, month, weeks, busyDays };
  });
}

const monthFormat = new Intl.DateTimeFormat('en-GB', { timeZone: 'UTC', month: 'long', year: 'numeric' });
const dayFormat = new Intl.DateTimeFormat('en-GB', {
  timeZone: 'UTC',
  weekday: 'long',
  day: 'numeric',
  month: 'long',
  year: 'numeric',
});

/** "December 2026" */
export function monthLabel(year: number, month: number): string {
  return monthFormat.format(new Date(Date.UTC(year, month - 1, 1)));
}

/** "Thursday, 3 December 2026" for a "YYYY-MM-DD" day. */
export function dayLabel(date: string): string {
  return dayFormat.format(new Date(`${date}T00:00:00Z`));
}

export const weekdayNames = ['Monday', 'Tuesday', 'Wednesday', 'Thursday', 'Friday', 'Saturday', 'Sunday'];
