import type { ReactNode } from 'react';
import { LightCurveSketch } from '@/components/light-curve-sketch';

export function AuthCard({ title, lead, children }: { title: string; lead: ReactNode; children: ReactNode }) {
  return (
    <div className="mx-auto w-full max-w-md">
      <div className="overflow-hidden rounded-lg border border-line bg-surface shadow-[0_1px_0_var(--color-line),0_12px_32px_-20px_rgb(29_35_48/0.35)]">
        <div className="border-b border-line bg-paper/70 px-6 pt-5 pb-3">
          <LightCurveSketch shape="strip" seed={title.length * 3} className="h-auto w-full" />
        </div>
        <div className="flex flex-col gap-6 px-6 py-6 md:px-8 md:py-8">
          <div className="flex flex-col gap-1.5">
            <h1 className="text-2xl font-semibold text-ink">{title}</h1>
            <div className="text-base text-muted">{lead}</div>
          </div>
          {children}
        </div>
      </div>
    </div>
  );
}
