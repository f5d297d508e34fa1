import type { ComponentProps, ReactNode } from 'react';
import { cn } from './cn';
import { Spinner } from './Spinner';

export type ButtonVariant = 'primary' | 'secondary' | 'ghost' | 'danger';
export type ButtonSize = 'sm' | 'md' | 'lg';

export interface ButtonProps extends ComponentProps<'button'> {
  variant?: ButtonVariant;
  /** sm 40 px, md 44 px, lg 48 px tall — never below the 40 px touch target. */
  size?: ButtonSize;
  /** Shows a spinner, sets aria-busy and blocks clicks while keeping the label readable. */
  loading?: boolean;
  /** Replaces the label while loading, e.g. "Saving…". */
  loadingText?: ReactNode;
  /** Icon before the label. */
  icon?: ReactNode;
  /** Icon after the label. */
  iconAfter?: ReactNode;
  fullWidth?: boolean;
}

export const buttonVariantClass: Record<ButtonVariant, string> = {
  primary: 'bg-accent text-white hover:bg-accent-hover active:bg-accent-active border border-transparent',
  secondary: 'bg-paper-raised text-ink border border-line-strong hover:bg-paper-sunk active:bg-line',
  ghost: 'bg-transparent text-ink border border-transparent hover:bg-paper-sunk active:bg-line',
  danger: 'bg-loss text-white hover:bg-loss-hover border border-transparent',
};

export const buttonSizeClass: Record<ButtonSize, string> = {
  sm: 'min-h-10 px-3 text-sm gap-1.5',
  md: 'min-h-11 px-4 text-base gap-2',
  lg: 'min-h-12 px-5 text-lg gap-2',
};

export const buttonBaseClass =
  'inline-flex items-center justify-center rounded-control font-semibold select-none whitespace-nowrap ' +
  'transition-colors focus-visible:outline-2 focus-visible:outline-offset-2 focus-visible:outline-focus ' +
  'disabled:cursor-not-allowed disabled:opacity-55 aria-busy:cursor-progress';

export function Button({
  variant = 'secondary',
  size = 'md',
  loading = false,
  loadingText,
  icon,
  iconAfter,
  fullWidth = false,
  type = 'button',
  disabled,
  className,
  children,
  onClick,
  ...rest
}: ButtonProps) {
  return (
    <button
      type={type}
      // A loading button stays focusable (aria-disabled) so focus isn't lost mid-submit.
      disabled={disabled && !loading}
      aria-disabled={loading || disabled || undefined}
      aria-busy={loading || undefined}
      onClick={loading ? (event) => event.preventDefault() : onClick}
      className={cn(buttonBaseClass, buttonVariantClass[variant], buttonSizeClass[size], fullWidth && 'w-full', className)}
      {...rest}
    >
      {loading ? <Spinner size={size === 'sm' ? 16 : 18} /> : icon}
      <span>{loading && loadingText ? loadingText : children}</span>
      {!loading && iconAfter}
    </button>
  );
}
