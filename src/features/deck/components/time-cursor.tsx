import { formatHours } from '../lib/card-summary';
import { stepTimeCursor } from '../lib/keyboard';

interface TimeCursorProps {
  valueHours: number;
  spanHours: number;
  stepHours: number;
  markHours: number | null;
  onChange: (hours: number) => void;
  onFocusChange: (focused: boolean) => void;
}

/**
 * The keyboard's way onto the chart: a slider over the snippet's time. Arrows move it; M sets or clears
 * the mark where it stands. Its line is drawn on the chart while it has focus.
 */
export function TimeCursor({
  valueHours,
  spanHours,
  stepHours,
  markHours,
  onChange,
  onFocusChange,
}: TimeCursorProps) {
  const share = spanHours > 0 ? (valueHours / spanHours) * 100 : 0;
  const markShare = markHours !== null && spanHours > 0 ? (markHours / spanHours) * 100 : null;
  return (
    <div
      role="slider"
      tabIndex={0}
      data-time-cursor
      aria-label="Time cursor"
      aria-valuemin={0}
      aria-valuemax={Math.round(spanHours * 100) / 100}
      aria-valuenow={Math.round(valueHours * 100) / 100}
      aria-valuetext={`${formatHours(valueHours)} from the start${markHours !== null ? `; mark at ${formatHours(markHours)}` : ''}`}
      aria-describedby="time-cursor-hint"
      onFocus={() => onFocusChange(true)}
      onBlur={() => onFocusChange(false)}
      onKeyDown={(event) => {
        const next = stepTimeCursor(event.key, valueHours, spanHours, stepHours);
        if (next === null) return;
        event.preventDefault();
        onChange(next);
      }}
      className="group relative flex min-h-target flex-1 cursor-pointer items-center rounded-md px-2"
    >
      <span aria-hidden="true" className="relative block h-1.5 w-full rounded-full bg-line">
        {markShare !== null ? (
          <span
            className="absolute -top-1 h-3.5 w-1 -translate-x-1/2 rounded-sm bg-amber"
            style={{ left: `${markShare}%` }}
          />
        ) : null}
        <span
          className="absolute top-1/2 size-4 -translate-x-1/2 -translate-y-1/2 rounded-full border-2 border-ink bg-surface group-focus-visible:bg-amber-wash"
          style={{ left: `${share}%` }}
        />
      </span>
      <span id="time-cursor-hint" className="sr-only">
        Arrow keys move the cursor along the snippet; press M to set or clear the mark there.
      </span>
    </div>
  );
}
