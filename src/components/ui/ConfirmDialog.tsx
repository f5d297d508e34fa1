import type { ReactNode } from 'react';
import { useRef } from 'react';
import { Button } from './Button';
import { Dialog } from './Dialog';

export interface ConfirmDialogProps {
  open: boolean;
  /** Question as the title, e.g. "Delete this run?". */
  title: ReactNode;
  /** What happens if confirmed, in plain words. */
  children?: ReactNode;
  /** Verb for the confirm button, e.g. "Delete run"; default "Confirm". */
  confirmLabel?: ReactNode;
  cancelLabel?: ReactNode;
  /** `danger` for destructive actions: red button and focus starts on Cancel. */
  tone?: 'primary' | 'danger';
  /** Spinner on the confirm button; Esc and Cancel are blocked meanwhile. */
  isConfirming?: boolean;
  onConfirm: () => void;
  onCancel: () => void;
}

/** Asks before doing something that is hard to undo. */
export function ConfirmDialog({
  open,
  title,
  children,
  confirmLabel = 'Confirm',
  cancelLabel = 'Cancel',
  tone = 'primary',
  isConfirming = false,
  onConfirm,
  onCancel,
}: ConfirmDialogProps) {
  const cancelRef = useRef<HTMLButtonElement>(null);
  const confirmRef = useRef<HTMLButtonElement>(null);
  return (
    <Dialog
      open={open}
      onClose={onCancel}
      title={title}
      size="sm"
      busy={isConfirming}
      dismissible={false}
      hideCloseButton
      initialFocusRef={tone === 'danger' ? cancelRef : confirmRef}
      footer={
        <>
          <Button ref={cancelRef} variant="secondary" onClick={onCancel} disabled={isConfirming}>
            {cancelLabel}
          </Button>
          <Button ref={confirmRef} variant={tone} onClick={onConfirm} loading={isConfirming}>
            {confirmLabel}
          </Button>
        </>
      }
    >
      {children != null && <div className="text-ink">{children}</div>}
    </Dialog>
  );
}
