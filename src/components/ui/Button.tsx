import type { ComponentProps, ReactNode } from 'react';
import { cn } from './cn';
import { Spinner } from './Spinner';
import { buttonBaseClass, buttonSizeClass, buttonVariantClass, type ButtonSize, type ButtonVariant } from './styles';

export type { ButtonSize, ButtonVariant };

export interface ButtonProps extends ComponentProps<'button'> {
  variant?: ButtonVariant;
  /** sm and md 44 px, lg 48 px tall — never below the 44 px touch target (WCAG 2.5.5). */
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
