import type { SelectHTMLAttributes } from 'react';

const selectClasses =
  'min-h-target rounded-md border border-edge bg-surface py-0 pr-9 pl-3 text-base text-ink hover:border-ink ' +
  'appearance-none bg-[length:12px_8px] bg-[right_0.8rem_center] bg-no-repeat';

// An inline chevron in ink keeps native select behaviour while dropping the platform's own arrow.
const chevron =
  "url(\"data:image/svg+xml,%3Csvg xmlns='http://www.w3.org/2000/svg' viewBox='0 0 12 8'%3E%3Cpath d='M1 1l5 5 5-5' fill='none' stroke='%231d2330' stroke-width='1.8'/%3E%3C/svg%3E\")";

export function Select({ className = '', style, ...rest }: SelectHTMLAttributes<HTMLSelectElement>) {
  return (
    <select
      {...rest}
      style={{ backgroundImage: chevron, ...style }}
      className={`${selectClasses} ${className}`}
    />
  );
}
