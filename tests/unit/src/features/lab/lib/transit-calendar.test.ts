import { describe, expect, it } from 'vitest';
import {
  calendarMonths,
  dayLabel,
  monthLabel,
  utcDayKey,
  windowsByDay,
} from '@/features/lab/lib/transit-calendar';

const at = (midUtc: string, epoch = 0) => ({ midUtc, epoch });

describe('utcDayKey', () => {
  it('takes the UTC day, not the reader’s: 23:30 UTC stays on its day whatever the zone', () => {
    expect(utcDayKey('2026-12-18T23:30:00.000Z')).toBe('2026-12-18');
    expect(utcDayKey('2026-12-19T00:15:27.756Z')).toBe('2026-12-19');
  });
});

describe('windowsByDay', () => {
  it('puts each window on the UTC day of its mid-transit, days and windows in time order', () => {
    const days = windowsByDay([
      at('2026-12-05T14:52:00Z', 2),
      at('2026-12-03T09:18:00Z', 1),
      at('2026-12-05T02:00:00Z', 3),
    ]);
    expect(days.map((day) => day.date)).toEqual(['2026-12-03', '2026-12-05']);
    expect(days[1]!.windows.map((window) => window.epoch)).toEqual([3, 2]);
    expect(days[1]!.dayOfMonth).toBe(5);
  });

  it('places a window that starts before midnight on the day its mid-transit falls', () => {
    // From the demo server: epoch 1520 starts 18 Dec 23:04 UTC, its middle is 19 Dec 00:15 UTC.
    const [day] = windowsByDay([
      { midUtc: '2026-12-19T00:15:27.756Z', startUtc: '2026-12-18T23:04:20.029Z' },
    ]);
    expect(day!.date).toBe('2026-12-19');
  });
});

describe('calendarMonths', () => {
  it('lays a month out Monday first, with blanks before the 1st and after the last day', () => {
    // 1 December 2026 is a Tuesday (and 31 December a Thursday).
    const [month] = calendarMonths([at('2026-12-03T09:18:00Z')]);
    expect(month!.key).toBe('2026-12');
    expect(month!.weeks[0]![0]).toBeNull();
    expect(month!.weeks[0]![1]!.date).toBe('2026-12-01');
    expect(month!.weeks.every((week) => week.length === 7)).toBe(true);
    const cells = month!.weeks.flat();
    expect(cells.filter((cell) => cell !== null)).toHaveLength(31);
    expect(month!.weeks.at(-1)!.slice(4)).toEqual([null, null, null]);
    expect(month!.busyDays.map((day) => day.date)).toEqual(['2026-12-03']);
    expect(cells.find((cell) => cell?.date === '2026-12-03')!.windows).toHaveLength(1);
  });

  it('handles a month that starts on a Monday and a leap February', () => {
    // 1 February 2027 is a Monday; February 2028 has 29 days.
    const [february2027] = calendarMonths([at('2027-02-10T00:00:00Z')]);
    expect(february2027!.weeks[0]![0]!.date).toBe('2027-02-01');
    expect(february2027!.weeks).toHaveLength(4);
    const [february2028] = calendarMonths([at('2028-02-29T12:00:00Z')]);
    expect(february2028!.weeks.flat().filter(Boolean)).toHaveLength(29);
  });

  it('leaves out months without a window and keeps the others in order across a year end', () => {
    const months = calendarMonths([
      at('2027-03-02T00:00:00Z'),
      at('2026-12-30T00:00:00Z'),
      at('2027-01-02T00:00:00Z'),
    ]);
    expect(months.map((month) => month.key)).toEqual(['2026-12', '2027-01', '2027-03']);
  });

  it('answers nothing for no windows', () => {
    expect(calendarMonths([])).toEqual([]);
  });
});

describe('labels', () => {
  it('names months and days in UTC', () => {
    expect(monthLabel(2026, 12)).toBe('December 2026');
    expect(dayLabel('2026-12-03')).toBe('Thursday, 3 December 2026');
  });
});
