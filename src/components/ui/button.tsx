import type { ButtonHTMLAttributes } from 'react';
import { cn } from '@/lib/cn.ts';

export type ButtonVariant = 'primary' | 'secondary' | 'quiet' | 'danger';
/** md = 48 px (every control), lg = 64 px (a screen's main action), xl = 80 px (in-room taps). */
export type ButtonSize = 'md' | 'lg' | 'xl';

const base =
  'inline-flex items-center justify-center gap-2 rounded-control border-2 font-bold leading-tight ' +
  'transition-colors select-none cursor-pointer disabled:cursor-not-allowed disabled:opacity-55 ' +
  'text-center no-underline';

const variants: Record<ButtonVariant, string> = {
  primary: 'border-primary bg-primary text-on-primary hover:bg-primary-hover hover:border-primary-hover',
  secondary: 'border-line-strong bg-surface text-text hover:bg-sunken',
  quiet: 'border-transparent bg-transparent text-text underline-offset-4 hover:underline',
  danger: 'border-danger bg-surface text-danger hover:bg-danger-soft',
};

const sizes: Record<ButtonSize, string> = {
  md: 'min-h-touch px-4 text-base',
  lg: 'min-h-touch-lg px-6 text-lg',
  xl: 'min-h-touch-xl px-8 text-xl',
};

/** The classes of a button, for links that look like one. */
export function buttonClass(variant: ButtonVariant = 'secondary', size: ButtonSize = 'md', extra?: string): string {
  return cn(base, variants[variant], sizes[size], extra);
}

type Props = ButtonHTMLAttributes<HTMLButtonElement> & { variant?: ButtonVariant; size?: ButtonSize; busy?: boolean };

export function Button({ variant = 'secondary', size = 'md', busy = false, className, type = 'button', disabled, children, ...rest }: Props) {
  return (
    <button type={type} className={buttonClass(variant, size, className)} disabled={disabled || busy} aria-busy={busy || undefined} {...rest}>
      {busy && <span aria-hidden className="size-4 animate-spin rounded-full border-2 border-current border-r-transparent" />}
      {children}
    </button>
  );
}
