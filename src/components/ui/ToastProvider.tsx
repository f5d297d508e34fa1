import type { ReactNode } from 'react';
import { useCallback, useEffect, useMemo, useRef, useState } from 'react';
import { cn } from './cn';
import { Icon, type IconName } from './Icon';
import { IconButton } from './IconButton';
import { ToastContext, type ToastApi, type ToastInput, type ToastKind, type ToastOptions } from './ToastContext';

interface ToastItem extends ToastInput {
  id: string;
}

const DEFAULT_DURATION: Record<ToastKind, number> = { success: 5000, info: 5000, error: 8000 };

const look: Record<ToastKind, { icon: IconName; iconClass: string; bar: string; srPrefix: string }> = {
  success: { icon: 'circle-check', iconClass: 'text-gain', bar: 'border-l-gain', srPrefix: 'Done:' },
  error: { icon: 'octagon', iconClass: 'text-loss', bar: 'border-l-loss', srPrefix: 'Error:' },
  info: { icon: 'circle-info', iconClass: 'text-info', bar: 'border-l-info', srPrefix: 'Note:' },
};

export interface ToastProviderProps {
  children: ReactNode;
  /** Most toasts on screen at once; older ones drop off. Default 4. */
  limit?: number;
}

let nextId = 0;

/** Width of the toast column (max-w-sm) plus its padding, in CSS pixels. */
const COLUMN_PX = 384 + 32;

/**
 * The side the toasts stack on: the right, unless the control just used (the focused element,
 * e.g. a form's Save button at the bottom right) sits where they would appear. Then the left, so
 * a toast never covers the control the user is about to use again.
 */
export function toastSide(focused: Element | null, viewport: { width: number; height: number }): 'left' | 'right' {
  if (!focused || focused === document.body || viewport.width < COLUMN_PX * 2) return 'right';
  const r = focused.getBoundingClientRect();
  const underColumn = r.right > viewport.width - COLUMN_PX && r.bottom > viewport.height / 2;
  return underColumn ? 'left' : 'right';
}

/** Holds the toast queue and renders the polite live region they appear in. */
export function ToastProvider({ children, limit = 4 }: ToastProviderProps) {
  const [toasts, setToasts] = useState<ToastItem[]>([]);
  const [side, setSide] = useState<'left' | 'right'>('right');

  const dismiss = useCallback((id: string) => {
    setToasts((list) => list.filter((t) => t.id !== id));
  }, []);

  const show = useCallback(
    (toast: ToastInput) => {
      nextId += 1;
      const id = `toast-${nextId}`;
      setSide(toastSide(document.activeElement, { width: window.innerWidth, height: window.innerHeight }));
      setToasts((list) => [...list, { ...toast, id }].slice(-limit));
      return id;
    },
    [limit],
  );

  const api = useMemo<ToastApi>(() => {
    const of = (kind: ToastKind) => (message: ReactNode, options?: ToastOptions) => show({ ...options, kind, message });
    return { show, dismiss, success: of('success'), error: of('error'), info: of('info') };
  }, [show, dismiss]);

  return (
    <ToastContext.Provider value={api}>
      {children}
      {/* Above any bar fixed to the bottom of the screen (useBottomBar), so no toast covers its controls. */}
      <section
        aria-label="Notifications"
        data-side={side}
        className={cn('pointer-events-none fixed inset-x-0 bottom-[var(--pb-bottom-bar,0px)] z-toast flex p-4', side === 'left' ? 'justify-start' : 'justify-end')}
      >
        {/* The live region is always in the DOM, so additions to it are announced. */}
        <ol aria-live="polite" aria-relevant="additions text" className="flex w-full max-w-sm flex-col gap-2">
          {toasts.map((toast) => (
            <ToastCard key={toast.id} toast={toast} onDismiss={dismiss} />
          ))}
        </ol>
      </section>
    </ToastContext.Provider>
  );
}

function ToastCard({ toast, onDismiss }: { toast: ToastItem; onDismiss: (id: string) => void }) {
  const { id, kind, message, description, action } = toast;
  const duration = toast.duration === undefined ? DEFAULT_DURATION[kind] : toast.duration;
  const [paused, setPaused] = useState(false);
  const remaining = useRef(duration ?? 0);

  useEffect(() => {
    if (duration === null || paused) return;
    const started = Date.now();
    const timer = window.setTimeout(() => onDismiss(id), remaining.current);
    return () => {
      window.clearTimeout(timer);
      remaining.current = Math.max(1000, remaining.current - (Date.now() - started));
    };
  }, [duration, paused, id, onDismiss]);

  const l = look[kind];
  return (
    <li
      // Pause while the pointer or focus is on the toast, so it can be read and acted on.
      onMouseEnter={() => setPaused(true)}
      onMouseLeave={() => setPaused(false)}
      onFocus={() => setPaused(true)}
      onBlur={() => setPaused(false)}
      className={cn(
        'pointer-events-auto flex animate-toast-in items-start gap-3 rounded-card border border-l-4 border-line bg-paper-raised p-3 shadow-overlay',
        l.bar,
      )}
    >
      <Icon name={l.icon} className={cn('mt-0.5', l.iconClass)} />
      <div className="min-w-0 flex-1">
        <p className="font-semibold text-ink">
          <span className="sr-only">{l.srPrefix} </span>
          {message}
        </p>
        {description != null && <p className="mt-0.5 text-sm text-ink-muted">{description}</p>}
        {action && (
          <button
            type="button"
            className="mt-1 min-h-10 font-semibold text-accent underline underline-offset-2 hover:text-accent-hover"
            onClick={() => {
              action.onClick();
              onDismiss(id);
            }}
          >
            {action.label}
          </button>
        )}
      </div>
      <IconButton label="Dismiss notification" size="sm" className="-my-1 -mr-1" icon={<Icon name="x" size={18} />} onClick={() => onDismiss(id)} />
    </li>
  );
}
