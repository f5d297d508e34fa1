import { useEffect } from 'react';
import { useBlocker } from 'react-router-dom';
import { ConfirmDialog } from '@/components/ui';

/**
 * While `active` (files still travelling), leaving asks first: links inside the app open a
 * question (the router's blocker), and closing the tab or reloading gets the browser's own prompt.
 */
export function LeaveGuard({ active, what }: { active: boolean; what: string }) {
  const blocker = useBlocker(({ currentLocation, nextLocation }) => active && currentLocation.pathname !== nextLocation.pathname);

  useEffect(() => {
    if (!active) return;
    const warn = (e: BeforeUnloadEvent) => {
      e.preventDefault();
      // Older browsers show the prompt only when returnValue is set.
      e.returnValue = '';
    };
    window.addEventListener('beforeunload', warn);
    return () => window.removeEventListener('beforeunload', warn);
  }, [active]);

  // The upload may finish while the question is open: then there is nothing left to protect.
  useEffect(() => {
    if (!active && blocker.state === 'blocked') blocker.proceed();
  }, [active, blocker]);

  return (
    <ConfirmDialog
      open={blocker.state === 'blocked'}
      title={`Leave while ${what}?`}
      confirmLabel="Leave anyway"
      cancelLabel="Stay on this page"
      tone="danger"
      onConfirm={() => blocker.proceed?.()}
      onCancel={() => blocker.reset?.()}
    >
      Files not yet sent are not uploaded. Files already sent are kept and listed on the session page.
    </ConfirmDialog>
  );
}
