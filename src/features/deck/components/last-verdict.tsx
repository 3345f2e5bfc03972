import { useEffect, useMemo, useState } from 'react';
import { Button } from '@/components/button';
import { LightCurvePlot, type PlotBand, type PlotMarker } from '@/components/light-curve-plot';
import { formatHours } from '../lib/card-summary';
import { answerLabels, plantedBandHours } from '../lib/cards';
import { undoRemainingMs } from '../lib/undo-window';
import type { LastVerdict } from './use-deck-session';

interface LastVerdictPanelProps {
  last: LastVerdict | null;
  onUndo: () => void;
}

/** The verdict just given: undo for 15 seconds, then what the server revealed about the card. */
export function LastVerdictPanel({ last, onUndo }: LastVerdictPanelProps) {
  const [now, setNow] = useState(() => Date.now());
  const remainingMs = undoRemainingMs(last?.state === 'undone' ? null : last, now);

  // A second-by-second countdown, only while there is something to take back.
  useEffect(() => {
    if (remainingMs <= 0) return;
    const timer = setTimeout(() => setNow(Date.now()), Math.min(1_000, remainingMs));
    return () => clearTimeout(timer);
  }, [remainingMs]);

  // biome-ignore lint/correctness/useExhaustiveDependencies: a new verdict restarts the countdown.
  useEffect(() => setNow(Date.now()), [last?.clientId]);

  return (
    <section
      aria-labelledby="last-verdict-heading"
      className="flex flex-col gap-3 rounded-lg border border-line bg-surface p-4"
    >
      <div className="flex items-center justify-between gap-3">
        <h2 id="last-verdict-heading" className="text-sm font-semibold text-ink">
          Your last verdict
        </h2>
        <Button
          variant="secondary"
          className="text-sm"
          disabled={remainingMs <= 0}
          aria-keyshortcuts="Z"
          onClick={onUndo}
        >
          Undo
          {remainingMs > 0 ? (
            <span className="tabular text-xs text-muted">{Math.ceil(remainingMs / 1000)} s</span>
          ) : null}
        </Button>
      </div>
      {last ? <LastVerdictBody last={last} /> : <p className="text-sm text-muted">None yet on this visit.</p>}
    </section>
  );
}

function LastVerdictBody({ last }: { last: LastVerdict }) {
  const feedback = last.reveal?.feedback ?? null;
  const planted = feedback?.kind === 'planted' ? plantedBandHours(last.card, feedback) : null;
  const bands = useMemo<PlotBand[]>(() => {
    if (feedback?.kind !== 'planted') return [];
    const band = plantedBandHours(last.card, feedback);
    return [{ start: band.startHours, end: band.endHours, tone: 'amber', label: 'planted', emphasis: true }];
  }, [feedback, last.card]);
  const markers = useMemo<PlotMarker[]>(
    () => (last.markHours !== null ? [{ x: last.markHours, label: 'your mark' }] : []),
    [last.markHours],
  );

  return (
    <div className="flex flex-col gap-2 text-sm">
      <p className="text-ink">
        <span
          className={`font-semibold ${last.answer === 'dip' ? 'text-amber-ink' : last.answer === 'flat' ? 'text-slate' : 'text-ink'}`}
        >
          {answerLabels[last.answer]}
        </span>
        {last.markHours !== null ? (
          <span className="tabular text-muted"> · mark {formatHours(last.markHours)}</span>
        ) : null}
        {last.reveal?.designation ? (
          <>
            {' '}
            on <span className="tabular text-ink">{last.reveal.designation}</span>
          </>
        ) : null}
      </p>
      <p className="text-muted">
        {last.state === 'waiting'
          ? 'Sending… it waits on this device until the server has it.'
          : last.state === 'sent'
            ? 'Recorded.'
            : last.state === 'undone'
              ? 'Taken back: the card is on top again.'
              : 'Not recorded.'}
      </p>
      {feedback?.kind === 'quiet' ? (
        <p className="rounded-md bg-slate-wash px-3 py-2 text-slate">
          This card was a <strong>quiet control</strong>: the science team knows it holds no dip.
          {last.answer === 'flat' ? ' You said flat, too.' : ' Flat was the answer here.'}
        </p>
      ) : null}
      {feedback?.kind === 'planted' && planted ? (
        <div className="flex flex-col gap-2">
          <p className="rounded-md bg-amber-wash px-3 py-2 text-ink">
            This card was a <strong>planted control</strong>: we added a dip to real data, centred at{' '}
            <span className="tabular">{formatHours(planted.centreHours)}</span> and lasting{' '}
            <span className="tabular">{formatHours(feedback.durationHours)}</span> (shaded below).
            {last.answer === 'dip' ? ' You found it.' : ' It is easy to miss; now you know its shape.'}
          </p>
          <LightCurvePlot
            x={last.card.hours}
            y={last.card.ppm}
            bands={bands}
            markers={markers}
            height={150}
            xLabel="Hours"
            yLabel="ppm"
            xUnit="h"
            yUnit="ppm"
            label={`The card you just judged, with the planted dip shaded from ${formatHours(planted.startHours)} to ${formatHours(planted.endHours)}.`}
          />
        </div>
      ) : null}
    </div>
  );
}
