import type { ButtonHTMLAttributes, ReactNode } from 'react';
import { cn } from '#src/lib/cn';
import { Spinner } from './spinner';

export type ButtonVariant = 'primary' | 'secondary' | 'quiet' | 'danger';
export type ButtonSize = 'md' | 'lg';

const variantClasses: Record<ButtonVariant, string> = {
  primary: 'bg-moss-700 text-white hover:bg-moss-800 active:bg-moss-900 border border-moss-800',
  secondary: 'bg-white text-loam-900 border border-loam-300 hover:bg-husk-100 active:bg-husk-200',
  quiet: 'bg-transparent text-moss-800 border border-transparent hover:bg-moss-50 active:bg-moss-100',
  danger: 'bg-clay-700 text-white border border-clay-800 hover:bg-clay-800 active:bg-clay-900',
};

// Every size keeps at least a 44 × 44 px target: fingers at the potting bench are wet and wide.
const sizeClasses: Record<ButtonSize, string> = {
  md: 'min-h-11 min-w-11 px-4 text-base gap-2',
  lg: 'min-h-12 min-w-12 px-5 text-lg gap-2.5',
};

/** The button look, for links that should read as buttons (`<a className={buttonStyles()}>`). */
export function buttonStyles({
  variant = 'primary',
  size = 'md',
  fullWidth = false,
}: { variant?: ButtonVariant; size?: ButtonSize; fullWidth?: boolean } = {}): string {
  return cn(
    'inline-flex items-center justify-center rounded-lg font-semibold leading-tight no-underline',
    'transition-colors select-none touch-manipulation',
    'disabled:cursor-not-allowed disabled:opacity-60 aria-disabled:cursor-not-allowed aria-disabled:opacity-60',
    variantClasses[variant],
    sizeClasses[size],
    fullWidth && 'w-full',
  );
}

export interface ButtonProps extends ButtonHTMLAttributes<HTMLButtonElement> {
  variant?: ButtonVariant;
  size?: ButtonSize;
  fullWidth?: boolean;
  /** Shows a spinner, keeps the label for screen readers and blocks further presses. */
  isLoading?: boolean;
  /** An icon before the label (decorative; the label names the action). */
  icon?: ReactNode;
}

export function Button({
  variant = 'primary',
  size = 'md',
  fullWidth = false,
  isLoading = false,
  icon,
  type = 'button',
  className,
  disabled,
  children,
  ...rest
}: ButtonProps) {
  return (
    <button
      type={type}
      className={cn(buttonStyles({ variant, size, fullWidth }), className)}
      disabled={disabled || isLoading}
      aria-busy={isLoading || undefined}
      {...rest}
    >
      {isLoading ? (
        <Spinner size="sm" decorative />
      ) : icon ? (
        <span aria-hidden="true" className="inline-flex shrink-0">
          {icon}
        </span>
      ) : null}
      {children}
    </button>
  );
}
