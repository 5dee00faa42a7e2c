import type { ButtonHTMLAttributes } from 'react';
import { cx } from '../lib/cx';

export type ButtonVariant = 'primary' | 'secondary' | 'danger' | 'quiet';

const variants: Record<ButtonVariant, string> = {
  primary: 'bg-ink text-paper hover:bg-ink-soft disabled:bg-ink-faint',
  secondary: 'bg-card text-ink border border-rule hover:border-ink-faint hover:bg-paper',
  danger: 'bg-card text-coral-deep border border-coral/50 hover:bg-coral-soft',
  quiet: 'text-ink-soft hover:text-ink hover:bg-paper-deep',
};

export const buttonClass = (variant: ButtonVariant = 'primary', size: 'md' | 'sm' = 'md') =>
  cx(
    'inline-flex items-center justify-center gap-2 rounded-lg font-semibold transition-colors',
    'disabled:cursor-not-allowed disabled:opacity-70',
    // A medium button is as tall as a text field, so they line up in a row.
    size === 'md' ? 'min-h-10.5 px-4 py-2 text-sm' : 'px-2.5 py-1 text-sm',
    variants[variant],
  );

export interface ButtonProps extends ButtonHTMLAttributes<HTMLButtonElement> {
  variant?: ButtonVariant;
  size?: 'md' | 'sm';
  /** Shows the busy label and disables the button while a request is in flight. */
  busy?: boolean;
  busyLabel?: string;
}

export function Button({ variant = 'primary', size = 'md', busy = false, busyLabel, className, children, disabled, type = 'button', ...rest }: ButtonProps) {
  return (
    <button
      type={type}
      className={cx(buttonClass(variant, size), className)}
      disabled={disabled || busy}
      aria-busy={busy || undefined}
      {...rest}
    >
      {busy && busyLabel ? busyLabel : children}
    </button>
  );
}
