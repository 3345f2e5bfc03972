import type { ReactNode } from 'react';

type Tone = 'amber' | 'slate' | 'danger' | 'success';

const tones: Record<Tone, string> = {
  amber: 'bg-amber-wash text-amber-ink',
  slate: 'bg-slate-wash text-slate',
  danger: 'bg-danger-wash text-danger',
  success: 'bg-success-wash text-success',
};

export function Badge({ tone, children }: { tone: Tone; children: ReactNode }) {
  return (
    <span className={`inline-flex items-center rounded-sm px-2 py-0.5 text-xs font-semibold ${tones[tone]}`}>
      {children}
    </span>
  );
}
