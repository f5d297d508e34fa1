import type { ReactNode, RefObject } from 'react';
import { useEffect, useId, useRef } from 'react';
import { cn } from './cn';
import { Icon } from './Icon';
import { IconButton } from './IconButton';

export interface DialogProps {
  open: boolean;
  /** Called for Esc, the close button and (if `dismissible`) a click on the backdrop. */
  onClose: () => void;
  /** Visible title; labels the dialog. */
  title: ReactNode;
  /** Line under the title; describes the dialog. */
  description?: ReactNode;
  children?: ReactNode;
  /** Buttons row at the bottom, right-aligned. */
  footer?: ReactNode;
  size?: 'sm' | 'md' | 'lg' | 'xl';
  /** Close on backdrop click; default true. Esc always closes unless `busy`. */
  dismissible?: boolean;
  /** While true (e.g. saving), Esc, backdrop and the close button do nothing. */
  busy?: boolean;
  /**
   * Element to focus when opening. Default: the first field of the body; without fields, the body's
   * first control, else the footer's first button (Cancel). Never the × button: Enter pressed at once
   * must not close a dialog unsaved.
   */
  initialFocusRef?: RefObject<HTMLElement | null>;
  /** Hide the × button (ConfirmDialog has its own Cancel). */
  hideCloseButton?: boolean;
  className?: string;
}

const FIELD = 'input:not([type="hidden"]):not(:disabled), select:not(:disabled), textarea:not(:disabled)';
const CONTROL = `${FIELD}, button:not(:disabled), a[href], [tabindex]:not([tabindex="-1"])`;

function firstShown(root: Element | null, selector: string): HTMLElement | null {
  if (!root) return null;
  for (const el of root.querySelectorAll<HTMLElement>(selector)) if (el.getClientRects().length > 0) return el;
  return null;
}

/** Where focus goes when a dialog opens without an `initialFocusRef` (see DialogProps). */
export function defaultFocusTarget(dialog: HTMLElement): HTMLElement | null {
  const body = dialog.querySelector('[data-dialog-body]');
  const footer = dialog.querySelector('[data-dialog-footer]');
  return firstShown(body, FIELD) ?? firstShown(body, CONTROL) ?? firstShown(footer, CONTROL);
}

const sizeClass = { sm: 'max-w-sm', md: 'max-w-lg', lg: 'max-w-2xl', xl: 'max-w-4xl' } as const;

/**
 * A modal built on the native <dialog> element: `showModal()` makes the rest of the page inert
 * (so focus stays inside), gives Esc-to-close and the top layer for free. Focus returns to the
 * element that opened it.
 */
export function Dialog({
  open,
  onClose,
  title,
  description,
  children,
  footer,
  size = 'md',
  dismissible = true,
  busy = false,
  initialFocusRef,
  hideCloseButton = false,
  className,
}: DialogProps) {
  const ref = useRef<HTMLDialogElement>(null);
  const titleId = useId();
  const descriptionId = useId();
  const onCloseRef = useRef(onClose);
  const busyRef = useRef(busy);
  useEffect(() => {
    onCloseRef.current = onClose;
    busyRef.current = busy;
  });

  useEffect(() => {
    const dialog = ref.current;
    if (!dialog || !open) return;
    const opener = document.activeElement instanceof HTMLElement ? document.activeElement : null;
    if (!dialog.open) {
      if (typeof dialog.showModal === 'function') dialog.showModal();
      else dialog.setAttribute('open', '');
    }
    (initialFocusRef?.current ?? defaultFocusTarget(dialog))?.focus();
    const root = document.documentElement;
    const previousOverflow = root.style.overflow;
    root.style.overflow = 'hidden';
    return () => {
      root.style.overflow = previousOverflow;
      if (dialog.open) {
        if (typeof dialog.close === 'function') dialog.close();
        else dialog.removeAttribute('open');
      }
      if (opener?.isConnected) opener.focus();
    };
  }, [open, initialFocusRef]);

  useEffect(() => {
    const dialog = ref.current;
    if (!dialog) return;
    // Esc fires "cancel": keep the element open and let the owner decide via onClose.
    const onCancel = (event: Event) => {
      event.preventDefault();
      if (!busyRef.current) onCloseRef.current();
    };
    dialog.addEventListener('cancel', onCancel);
    return () => dialog.removeEventListener('cancel', onCancel);
  }, []);

  return (
    <dialog
      ref={ref}
      aria-labelledby={titleId}
      aria-describedby={description != null ? descriptionId : undefined}
      aria-busy={busy || undefined}
      onClick={(event) => {
        // The panel fills the dialog box, so a click landing on the <dialog> itself is the backdrop.
        if (dismissible && !busy && event.target === event.currentTarget) onClose();
      }}
      className={cn(
        'm-auto w-[calc(100%-2rem)] rounded-card bg-transparent p-0 text-ink shadow-overlay backdrop:bg-ink/45',
        sizeClass[size],
        className,
      )}
    >
      {open && (
        <div className="flex max-h-[calc(100dvh-4rem)] flex-col rounded-card border border-line bg-paper-raised">
          <header className="flex items-start justify-between gap-3 border-b border-line px-5 py-4">
            <div className="min-w-0">
              <h2 id={titleId} className="text-xl font-semibold text-ink">
                {title}
              </h2>
              {description != null && (
                <p id={descriptionId} className="mt-1 text-ink-muted">
                  {description}
                </p>
              )}
            </div>
            {!hideCloseButton && (
              <IconButton
                label="Close"
                size="sm"
                className="-mr-2 -mt-1"
                icon={<Icon name="x" />}
                disabled={busy}
                onClick={onClose}
              />
            )}
          </header>
          {children != null && <div data-dialog-body className="min-h-0 flex-1 overflow-y-auto px-5 py-4">{children}</div>}
          {footer != null && (
            <footer data-dialog-footer className="flex flex-wrap items-center justify-end gap-2 border-t border-line px-5 py-3">{footer}</footer>
          )}
        </div>
      )}
    </dialog>
  );
}
