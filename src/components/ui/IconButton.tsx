import type { ComponentProps, ReactNode } from 'react';
import { cn } from './cn';
import { Spinner } from './Spinner';
import { buttonBaseClass, buttonVariantClass, type ButtonVariant } from './styles';

export interface IconButtonProps extends Omit<ComponentProps<'button'>, 'children'> {
  /** Accessible name, also shown as a tooltip. Required: an icon alone has no name. */
  label: string;
  /** The icon, e.g. `<Icon name="x" />`. */
  icon: ReactNode;
  variant?: ButtonVariant;
  /** Kept for callers; both are 44 px square now (the smallest touch target on the bay tablet). */
  size?: 'sm' | 'md';
  loading?: boolean;
}

export function IconButton({
  label,
  icon,
  variant = 'ghost',
  size: _size = 'md',
  loading = false,
  type = 'button',
  title,
  disabled,
  className,
  onClick,
  ...rest
}: IconButtonProps) {
  return (
    <button
      type={type}
      aria-label={label}
      title={title ?? label}
      disabled={disabled && !loading}
      aria-disabled={loading || disabled || undefined}
      aria-busy={loading || undefined}
      onClick={loading ? (event) => event.preventDefault() : onClick}
      className={cn(buttonBaseClass, buttonVariantClass[variant], 'size-11', 'p-0', className)}
      {...rest}
    >
      {loading ? <Spinner size={18} /> : icon}
    </button>
  );
}
