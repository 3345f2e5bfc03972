import type { ReactNode } from 'react';
import { LightCurveSketch } from '@/components/light-curve-sketch';

interface EmptyStateProps {
  title: string;
  children: ReactNode;
  /** What the reader can expect here once there is something to show. */
  upcoming?: readonly string[];
  action?: ReactNode;
  sketch?: 'dip' | 'flat';
}

export function EmptyState({ title, children, upcoming, action, sketch = 'flat' }: EmptyStateProps) {
  return (
    <section className="overflow-hidden rounded-lg border border-line bg-surface">
      <div className="border-b border-dashed border-line bg-paper/60 px-4 py-5 md:px-8">
        <LightCurveSketch
          dip={sketch === 'dip'}
          shape="strip"
          seed={title.length}
          className="mx-auto h-auto w-full max-w-3xl"
        />
      </div>
      <div className="flex flex-col gap-4 px-5 py-6 md:px-8 md:py-8">
        <h2 className="text-xl font-semibold text-ink">{title}</h2>
        <div className="max-w-2xl text-base text-muted">{children}</div>
        {upcoming && upcoming.length > 0 ? (
          <div className="flex flex-col gap-2">
            <p className="tabular text-xs font-medium uppercase tracking-[0.14em] text-amber-ink">
              What will appear here
            </p>
            <ul className="flex flex-col gap-1.5">
              {upcoming.map((item) => (
                <li key={item} className="flex gap-2.5 text-base text-ink">
                  <span aria-hidden="true" className="mt-2.5 h-0.5 w-3 shrink-0 bg-amber" />
                  {item}
                </li>
              ))}
            </ul>
          </div>
        ) : null}
        {action ? <div className="pt-1">{action}</div> : null}
      </div>
    </section>
  );
}
