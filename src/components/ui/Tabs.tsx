import type { KeyboardEvent, ReactNode } from 'react';
import { useId, useRef, useState } from 'react';
import { cn } from './cn';

export interface TabItem {
  id: string;
  label: ReactNode;
  /** Panel content; rendered only for the selected tab. */
  content: ReactNode;
  disabled?: boolean;
  /** Small count or badge after the label. */
  badge?: ReactNode;
}

export interface TabsProps {
  /** Accessible name of the tab list, e.g. "Run views". */
  label: string;
  items: readonly TabItem[];
  /** Controlled selected id; pair with onChange. */
  value?: string;
  /** Uncontrolled initial id; default the first enabled tab. */
  defaultValue?: string;
  onChange?: (id: string) => void;
  className?: string;
  panelClassName?: string;
}

/**
 * Tabs following the WAI-ARIA Authoring Practices tabs pattern: one Tab stop for the list,
 * ←/→ move and select (automatic activation), Home/End jump to the ends.
 */
export function Tabs({ label, items, value, defaultValue, onChange, className, panelClassName }: TabsProps) {
  const baseId = useId();
  const firstEnabled = items.find((item) => !item.disabled)?.id;
  const [internal, setInternal] = useState(defaultValue ?? firstEnabled);
  const selected = value ?? internal;
  const tabRefs = useRef(new Map<string, HTMLButtonElement>());

  const select = (id: string) => {
    if (value === undefined) setInternal(id);
    onChange?.(id);
  };

  const onKeyDown = (event: KeyboardEvent<HTMLDivElement>) => {
    const enabled = items.filter((item) => !item.disabled);
    const index = enabled.findIndex((item) => item.id === selected);
    let next: TabItem | undefined;
    if (event.key === 'ArrowRight') next = enabled[(index + 1) % enabled.length];
    else if (event.key === 'ArrowLeft') next = enabled[(index - 1 + enabled.length) % enabled.length];
    else if (event.key === 'Home') next = enabled[0];
    else if (event.key === 'End') next = enabled[enabled.length - 1];
    if (!next) return;
    event.preventDefault();
    select(next.id);
    tabRefs.current.get(next.id)?.focus();
  };

  const current = items.find((item) => item.id === selected);
  const tabId = (id: string) => `${baseId}-tab-${id}`;
  const panelId = (id: string) => `${baseId}-panel-${id}`;

  return (
    <div className={className}>
      <div
        role="tablist"
        aria-label={label}
        onKeyDown={onKeyDown}
        className="flex gap-1 overflow-x-auto border-b border-line"
      >
        {items.map((item) => {
          const isSelected = item.id === selected;
          return (
            <button
              key={item.id}
              ref={(el) => {
                if (el) tabRefs.current.set(item.id, el);
                else tabRefs.current.delete(item.id);
              }}
              type="button"
              role="tab"
              id={tabId(item.id)}
              aria-selected={isSelected}
              aria-controls={panelId(item.id)}
              tabIndex={isSelected ? 0 : -1}
              disabled={item.disabled}
              onClick={() => select(item.id)}
              className={cn(
                '-mb-px inline-flex min-h-11 items-center gap-2 whitespace-nowrap border-b-[3px] px-4 font-semibold transition-colors',
                'focus-visible:outline-2 focus-visible:-outline-offset-2 focus-visible:outline-focus',
                'disabled:cursor-not-allowed disabled:opacity-50',
                isSelected ? 'border-accent text-ink' : 'border-transparent text-ink-muted hover:border-line-strong hover:text-ink',
              )}
            >
              {item.label}
              {item.badge != null && <span className="num text-sm font-medium text-ink-subtle">{item.badge}</span>}
            </button>
          );
        })}
      </div>
      {current && (
        <div
          role="tabpanel"
          id={panelId(current.id)}
          aria-labelledby={tabId(current.id)}
          tabIndex={0}
          className={cn('pt-4 focus-visible:outline-2 focus-visible:outline-focus', panelClassName)}
        >
          {current.content}
        </div>
      )}
    </div>
  );
}
