import type { ReactNode } from 'react';

type Tone = 'danger' | 'success' | 'note';

const tones: Record<Tone, string> = {
  danger: 'border-danger bg-danger-wash text-danger',
  success: 'border-success bg-success-wash text-success',
  note: 'border-amber bg-amber-wash text-ink',
};

interface AlertProps {
  tone: Tone;
  title?: string;
  children: ReactNode;
}

export function Alert({ tone, title, children }: AlertProps) {
  return (
    <div
      role={tone === 'danger' ? 'alert' : 'status'}
      className={`rounded-md border-l-4 px-4 py-3 text-sm ${tones[tone]}`}
    >
      {title ? <p className="font-semibold">{title}</p> : null}
      <div className={title ? 'mt-0.5' : ''}>{children}</div>
    </div>
  );
}
