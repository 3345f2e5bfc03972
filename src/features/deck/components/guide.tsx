import { useMemo, useState } from 'react';
import { Button } from '@/components/button';
import { LightCurvePlot } from '@/components/light-curve-plot';
import { binSeries, breakAtGaps } from '../lib/binning';
import { type ExampleCard, type ExampleKind, makeGuideExamples } from '../lib/guide-examples';

const guideSeenKey = 'dipdeck.guide-seen.v1';

export function guideSeen(): boolean {
  try {
    return window.localStorage.getItem(guideSeenKey) === 'yes';
  } catch {
    return false;
  }
}

function rememberGuideSeen() {
  try {
    window.localStorage.setItem(guideSeenKey, 'yes');
  } catch {
    // Without storage the guide shows again next time; that is all.
  }
}

const steps: Record<ExampleKind, { title: string; answer: string; body: string; markHours?: number }> = {
  transit: {
    title: 'A planet crossing its star',
    answer: 'Dip → swipe right',
    body: 'Each card is a few hours of one star’s brightness: dots are measurements, the dark line follows their average. A planet in front of its star dims it for a while, with a flat bottom, like here. Tap the chart where the dip is deepest to mark it (the amber line); tap again to move the mark.',
    markHours: 6.4,
  },
  'eclipsing-binary': {
    title: 'Two stars eclipsing',
    answer: 'Still a dip → swipe right',
    body: 'A deep, V-shaped dip is often a pair of stars passing in front of each other. Say dip all the same: the science team tells binaries from planets later, and they need to know where every dip is.',
    markHours: 5.6,
  },
  'jump-after-gap': {
    title: 'A jump after a gap',
    answer: 'Flat → swipe left, or unsure ↑',
    body: 'When the data stops for a while and comes back at a different level, that is the instrument, not the star. It is no dip. If you cannot tell what you are looking at, swipe up for unsure: that helps too.',
  },
  flat: {
    title: 'A quiet star',
    answer: 'Flat → swipe left',
    body: 'Most cards look like this: only noise. Say flat and move on. Changed your mind? Undo (Z) takes back your last verdict for 15 seconds. On a keyboard: → dip, ← flat, ↑ unsure, M marks at the time cursor.',
  },
};

/** A short, skippable first-run walkthrough on four invented example cards. */
export function Guide({ onDone }: { onDone: () => void }) {
  const examples = useMemo(() => makeGuideExamples(), []);
  const [index, setIndex] = useState(0);
  const example = examples[index]!;
  const step = steps[example.kind];
  const last = index === examples.length - 1;

  function finish() {
    rememberGuideSeen();
    onDone();
  }

  return (
    <section
      aria-labelledby="guide-heading"
      className="mx-auto flex w-full max-w-3xl flex-col gap-4 rounded-lg border border-line bg-surface p-4 md:p-6"
    >
      <div className="flex items-center justify-between gap-3">
        <p className="tabular text-xs font-medium uppercase tracking-[0.14em] text-amber-ink">
          Guide · {index + 1} of {examples.length}
        </p>
        <Button variant="quiet" className="text-sm" onClick={finish}>
          Skip the guide
        </Button>
      </div>
      <h2 id="guide-heading" className="text-xl font-semibold text-ink">
        {step.title}
      </h2>
      <ExamplePlot example={example} markHours={step.markHours ?? null} title={step.title} />
      <p className="inline-flex w-fit rounded-md bg-paper px-3 py-1.5 text-sm font-semibold text-ink">
        {step.answer}
      </p>
      <p className="text-base text-muted">{step.body}</p>
      <div className="flex flex-wrap items-center justify-between gap-3 pt-1">
        <Button variant="secondary" disabled={index === 0} onClick={() => setIndex((value) => value - 1)}>
          Back
        </Button>
        {last ? (
          <Button onClick={finish}>Start judging</Button>
        ) : (
          <Button onClick={() => setIndex((value) => value + 1)}>Next example</Button>
        )}
      </div>
    </section>
  );
}

function ExamplePlot({
  example,
  markHours,
  title,
}: {
  example: ExampleCard;
  markHours: number | null;
  title: string;
}) {
  const line = useMemo(() => {
    const binned = breakAtGaps(binSeries(example.hours, example.ppm, 0.3), 0.75);
    return { x: binned.hours, y: binned.ppm };
  }, [example]);
  const markers = useMemo(() => (markHours === null ? [] : [{ x: markHours, label: 'mark' }]), [markHours]);
  return (
    <LightCurvePlot
      key={example.kind}
      x={example.hours}
      y={example.ppm}
      line={line}
      markers={markers}
      height={220}
      hideReadout
      xLabel="Hours from the snippet’s start"
      yLabel="Brightness (ppm)"
      xUnit="h"
      yUnit="ppm"
      label={`An invented example card: ${title.toLowerCase()}, over ${example.durationHours} hours.`}
    />
  );
}
