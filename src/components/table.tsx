import type { HTMLAttributes, ReactNode, TdHTMLAttributes, ThHTMLAttributes } from 'react';

/*
 * Below the md breakpoint each row becomes a card and each cell shows its column name from `label`,
 * because a six-column table cannot be read at phone width.
 */

export function Table({ caption, children }: { caption: string; children: ReactNode }) {
  return (
    <div className="md:overflow-x-auto md:rounded-lg md:border md:border-line md:bg-surface">
      <table className="w-full border-collapse text-left">
        <caption className="sr-only">{caption}</caption>
        {children}
      </table>
    </div>
  );
}

export function TableHead({ children }: { children: ReactNode }) {
  return (
    <thead className="hidden border-b border-line bg-paper md:table-header-group">
      <tr>{children}</tr>
    </thead>
  );
}

export function Th({ children, className = '', ...rest }: ThHTMLAttributes<HTMLTableCellElement>) {
  return (
    <th
      scope="col"
      {...rest}
      className={`px-4 py-3 text-xs font-semibold uppercase tracking-[0.08em] text-muted ${className}`}
    >
      {children}
    </th>
  );
}

export function TableBody({ children }: { children: ReactNode }) {
  return <tbody className="flex flex-col gap-3 md:table-row-group">{children}</tbody>;
}

const cardLayouts = {
  stack: 'flex flex-col gap-2',
  // For rows of short numbers: two cells a line keeps the card about as tall as the row is wide.
  pairs: 'grid grid-cols-2 gap-x-6 gap-y-2',
} as const;

const rowAlignments = {
  middle: '',
  // Rows whose cells can grow (an opened stack trace) read better when every cell starts at the top.
  top: 'md:[&>td]:align-top',
} as const;

interface TrProps extends Omit<HTMLAttributes<HTMLTableRowElement>, 'className'> {
  children: ReactNode;
  card?: keyof typeof cardLayouts;
  align?: keyof typeof rowAlignments;
  /** The row someone picked (its preview is showing): marked in amber, the colour of attention. */
  selected?: boolean;
}

export function Tr({ children, card = 'stack', align = 'middle', selected = false, ...rest }: TrProps) {
  return (
    <tr
      {...rest}
      className={`${cardLayouts[card]} ${rowAlignments[align]} rounded-lg border p-4 md:table-row md:rounded-none md:border-0 md:border-b md:p-0 md:last:border-b-0 ${
        selected
          ? 'border-amber bg-amber-wash/60 md:border-b-line md:shadow-[inset_3px_0_0_var(--color-amber)]'
          : 'border-line bg-surface'
      }`}
    >
      {children}
    </tr>
  );
}

const cellLayouts = {
  row: 'flex items-center justify-between gap-4',
  // For long content (messages, stack traces) that needs the card's full width under its label.
  block: 'flex flex-col items-stretch gap-1.5',
} as const;

interface TdProps extends TdHTMLAttributes<HTMLTableCellElement> {
  label: string;
  card?: keyof typeof cellLayouts;
}

export function Td({ label, card = 'row', children, className = '', ...rest }: TdProps) {
  return (
    <td
      data-label={label}
      {...rest}
      className={
        `${cellLayouts[card]} md:table-cell md:px-4 md:py-3 md:align-middle ` +
        `before:text-xs before:font-semibold before:uppercase before:tracking-[0.08em] before:text-muted before:content-[attr(data-label)] md:before:content-none ${className}`
      }
    >
      {children}
    </td>
  );
}
