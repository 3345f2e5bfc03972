import { useMemo, useState } from 'react';
import { Button } from '@/components/button';
import { LightCurvePlot, type PlotMarker } from '@/components/light-curve-plot';
import { binSeries, binWidthHours, breakAtGaps } from '../lib/binning';
import { describeCard, formatHours } from '../lib/card-summary';
import type { Card } from '../lib/cards';
import { DataTable } from './data-table';
import { ListenButton } from './listen-button';
import { TimeCursor } from './time-cursor';

interface DeckCardProps {
  card: Card;
  /** Which card of this session this is, counting from 1. */
  position: number;
  markHours: number | null;
  cursorHours: number;
  onMark: (hours: number | null) => void;
  onCursor: (hours: number) => void;
  onHover: (hours: number | null) => void;
  plotHeight: number;
  /** Phones have no hover, so the cursor read-out under the chart would only take room. */
  showReadout: boolean;
}

/**
 * One snippet to judge. It shows the data and nothing else: not whether it is a control, not how others
 * answered, not which star it is (that comes after the verdict).
 */
export function DeckCard({
  card,
  position,
  markHours,
  cursorHours,
  onMark,
  onCursor,
  onHover,
  plotHeight,
  showReadout,
}: DeckCardProps) {
  const [cursorFocused, setCursorFocused] = useState(false);
  const summary = useMemo(() => describeCard(card), [card]);
  const line = useMemo(() => {
    const width = binWidthHours(card.durationHours, card.cadenceMinutes);
    const binned = breakAtGaps(binSeries(card.hours, card.ppm, width), width * 2.5);
    return { x: binned.hours, y: binned.ppm };
  }, [card]);
  const markers = useMemo(() => {
    const list: PlotMarker[] = [];
    if (markHours !== null) list.push({ x: markHours, label: formatHours(markHours) });
    if (cursorFocused) list.push({ x: cursorHours, tone: 'ink' });
    return list;
  }, [markHours, cursorHours, cursorFocused]);
  const stepHours = card.cadenceMinutes
    ? Math.max(card.cadenceMinutes / 60, card.durationHours / 200)
    : card.durationHours / 100;

  return (
    <article
      aria-labelledby="card-heading"
      data-snippet-id={card.snippetId}
      className="flex flex-col gap-2 p-3 md:gap-3 md:p-5"
    >
      <header className="flex flex-wrap items-baseline justify-between gap-x-4 gap-y-0.5">
        <h2 id="card-heading" className="text-base font-semibold text-ink">
          {card.campaign.name}
        </h2>
        <p className="tabular text-xs text-muted">
          card {position} this session · {formatHours(card.durationHours)}
        </p>
      </header>
      <LightCurvePlot
        x={card.hours}
        y={card.ppm}
        line={line}
        markers={markers}
        xMin={0}
        xMax={card.durationHours}
        xLabel="Hours from the snippet’s start"
        yLabel="Brightness (ppm)"
        xUnit="h"
        yUnit="ppm"
        label={`Light-curve snippet. ${summary}`}
        height={plotHeight}
        hideReadout={!showReadout}
        onTap={(hours) => onMark(Math.min(card.durationHours, Math.max(0, hours)))}
        onHover={onHover}
      />
      <div className="flex flex-wrap items-center gap-2">
        <TimeCursor
          valueHours={cursorHours}
          spanHours={card.durationHours}
          stepHours={stepHours}
          markHours={markHours}
          onChange={onCursor}
          onFocusChange={setCursorFocused}
        />
        <p className="tabular min-w-24 text-sm text-amber-ink" aria-live="polite">
          {markHours === null ? (
            <span className="text-muted">no mark</span>
          ) : (
            `mark ${formatHours(markHours)}`
          )}
        </p>
        <Button
          variant="secondary"
          className="text-sm"
          disabled={markHours === null}
          onClick={() => onMark(null)}
        >
          Clear mark
        </Button>
      </div>
    </article>
  );
}

/** What the card shows in words and numbers, and as sound: below the buttons, out of the thumb's way. */
export function CardDetails({ card }: { card: Card }) {
  const [showTable, setShowTable] = useState(false);
  const summary = useMemo(() => describeCard(card), [card]);
  return (
    <section
      aria-label="This card in words, numbers and sound"
      className="flex flex-col gap-3 rounded-lg border border-line p-3 md:p-4"
    >
      <p className="text-sm text-muted">{summary}</p>
      <div className="flex flex-wrap items-center gap-2">
        <ListenButton hours={card.hours} ppm={card.ppm} />
        <Button
          variant="secondary"
          className="text-sm"
          aria-expanded={showTable}
          onClick={() => setShowTable((value) => !value)}
        >
          {showTable ? 'Hide the data table' : 'Show the data table'}
        </Button>
      </div>
      {showTable ? (
        <DataTable hours={card.hours} ppm={card.ppm} caption="The plotted points of this snippet" />
      ) : null}
    </section>
  );
}
