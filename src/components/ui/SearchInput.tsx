import type { ComponentProps } from 'react';
import { useId, useRef } from 'react';
import { cn } from './cn';
import { Icon } from './Icon';
import { IconButton } from './IconButton';
import { controlClass } from './styles';

export interface SearchInputProps extends Omit<ComponentProps<'input'>, 'type' | 'value' | 'onChange' | 'defaultValue'> {
  /** Accessible name, e.g. "Search customers"; visually hidden unless `showLabel`. */
  label: string;
  showLabel?: boolean;
  value: string;
  /** Called on every keystroke; debounce the query with useDebouncedValue. */
  onValueChange: (value: string) => void;
  containerClassName?: string;
}

/** A search box with a clear button; Esc clears too. */
export function SearchInput({
  label,
  showLabel = false,
  value,
  onValueChange,
  id,
  placeholder = 'Search',
  className,
  containerClassName,
  onKeyDown,
  ...rest
}: SearchInputProps) {
  const autoId = useId();
  const inputId = id ?? `search-${autoId}`;
  const inputRef = useRef<HTMLInputElement>(null);
  return (
    <div className={cn('flex flex-col', containerClassName)}>
      <label htmlFor={inputId} className={cn(showLabel ? 'mb-1.5 text-sm font-semibold text-ink' : 'sr-only')}>
        {label}
      </label>
      <div className="relative">
        <Icon
          name="search"
          size={18}
          className="pointer-events-none absolute left-3 top-1/2 -translate-y-1/2 text-ink-subtle"
        />
        <input
          ref={inputRef}
          id={inputId}
          type="search"
          role="searchbox"
          autoComplete="off"
          spellCheck={false}
          value={value}
          placeholder={placeholder}
          onChange={(event) => onValueChange(event.target.value)}
          onKeyDown={(event) => {
            if (event.key === 'Escape' && value) {
              event.preventDefault();
              onValueChange('');
            }
            onKeyDown?.(event);
          }}
          // Hide the browser's own clear button; ours is touch-sized.
          className={cn(controlClass, 'pl-10 pr-11 [&::-webkit-search-cancel-button]:appearance-none', className)}
          {...rest}
        />
        {value && (
          <IconButton
            label="Clear search"
            size="sm"
            className="absolute right-0.5 top-1/2 -translate-y-1/2"
            icon={<Icon name="x" size={18} />}
            onClick={() => {
              onValueChange('');
              inputRef.current?.focus();
            }}
          />
        )}
      </div>
    </div>
  );
}
