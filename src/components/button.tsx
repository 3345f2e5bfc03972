import type { ButtonHTMLAttributes, ReactNode } from 'react';
import { Link, type LinkProps } from 'react-router-dom';

export type ButtonVariant = 'primary' | 'secondary' | 'quiet' | 'danger';

const base =
  'inline-flex min-h-target min-w-target items-center justify-center gap-2 rounded-md px-4 text-base font-medium ' +
  'transition-colors duration-150 select-none disabled:cursor-not-allowed disabled:opacity-60';

const variants: Record<ButtonVariant, string> = {
  primary: 'bg-ink text-paper hover:bg-slate active:bg-ink',
  secondary: 'border border-edge bg-surface text-ink hover:border-ink hover:bg-paper',
  quiet: 'text-ink hover:bg-amber-wash',
  danger: 'border border-danger bg-surface text-danger hover:bg-danger-wash',
};

export function buttonClasses(variant: ButtonVariant = 'primary', extra = ''): string {
  return `${base} ${variants[variant]} ${extra}`.trim();
}

interface ButtonProps extends ButtonHTMLAttributes<HTMLButtonElement> {
  variant?: ButtonVariant;
  busy?: boolean;
  children: ReactNode;
}

export function Button({
  variant = 'primary',
  busy = false,
  className = '',
  children,
  ...rest
}: ButtonProps) {
  return (
    <button
      type="button"
      {...rest}
      aria-busy={busy || undefined}
      disabled={rest.disabled || busy}
      className={buttonClasses(variant, className)}
    >
      {busy ? (
        <span
          aria-hidden="true"
          className="size-3 animate-spin rounded-full border-2 border-current border-r-transparent"
        />
      ) : null}
      {children}
    </button>
  );
}

interface ButtonLinkProps extends LinkProps {
  variant?: ButtonVariant;
}

export function ButtonLink({ variant = 'primary', className = '', ...rest }: ButtonLinkProps) {
  return <Link {...rest} className={buttonClasses(variant, className)} />;
}
