/**
 * A row of buttons that picks one way of showing the same thing (HTML or plain text, list or
 * calendar). Each button says whether it is the chosen one (aria-pressed) and, when given, which
 * panel it changes (aria-controls).
 */
export function ViewSwitch<View extends string>({
  legend,
  legendHidden = false,
  labels,
  value,
  onChange,
  controls,
}: {
  legend: string;
  /** The legend is read out but not shown, where the buttons explain themselves. */
  legendHidden?: boolean;
  labels: Record<View, string>;
  value: View;
  onChange: (view: View) => void;
  /** The id of the panel the choice changes. */
  controls?: string;
}) {
  const views = Object.keys(labels) as View[];
  return (
    <fieldset className="flex flex-col gap-1.5">
      <legend className={legendHidden ? 'sr-only' : 'mb-1.5 text-sm font-medium text-ink'}>{legend}</legend>
      <div className="inline-flex w-fit flex-wrap gap-1 rounded-lg border border-line bg-surface p-1">
        {views.map((view) => (
          <button
            key={view}
            type="button"
            aria-pressed={value === view}
            aria-controls={controls}
            onClick={() => onChange(view)}
            className={`flex min-h-target min-w-24 items-center justify-center rounded-md px-4 text-base font-medium transition-colors ${
              value === view ? 'bg-ink text-paper' : 'text-muted hover:bg-amber-wash hover:text-ink'
            }`}
          >
            {labels[view]}
          </button>
        ))}
      </div>
    </fieldset>
  );
}
