import type { ComponentPropsWithRef } from 'react';

type Variant = 'primary' | 'secondary' | 'ghost' | 'danger';

const VARIANTS: Record<Variant, string> = {
  primary: 'bg-accent text-accent-ink hover:brightness-110',
  secondary: 'bg-surface-2 text-ink border border-line hover:border-accent',
  ghost: 'text-ink hover:bg-surface-2',
  danger: 'bg-danger text-danger-ink hover:brightness-110',
};

/** Buttons are at least 44 px tall: usable with gloves on a moving deck. */
export function Button({
  variant = 'primary',
  className = '',
  type = 'button',
  ...props
}: ComponentPropsWithRef<'button'> & { variant?: Variant }) {
  return (
    <button
      type={type}
      className={`inline-flex min-h-11 items-center justify-center gap-2 rounded-lg px-4 text-sm font-semibold transition disabled:cursor-not-allowed disabled:opacity-50 ${VARIANTS[variant]} ${className}`}
      {...props}
    />
  );
}
