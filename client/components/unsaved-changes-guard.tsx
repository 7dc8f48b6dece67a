import { useEffect, type ReactNode } from 'react';
import { useBlocker } from 'react-router-dom';
import { ConfirmDialog } from './ui/modal-dialog';

export interface UnsavedChangesGuardProps {
  /** True while there are changes that leaving would lose (or leave unsent). */
  when: boolean;
  /** What happens to the changes if the person leaves anyway. */
  description: ReactNode;
}

/**
 * Asks before leaving a page with unsaved changes: a dialog for a link or Back
 * inside the app (React Router's blocker; a change of query string or hash on
 * the same page is not leaving), and the browser's own question when the tab
 * is closed or reloaded. Neither is armed while `when` is false, so a save that
 * navigates away must first make it false.
 */
export function UnsavedChangesGuard({ when, description }: UnsavedChangesGuardProps) {
  const blocker = useBlocker(({ currentLocation, nextLocation }) => when && currentLocation.pathname !== nextLocation.pathname);

  useEffect(() => {
    if (!when) return;
    const ask = (event: BeforeUnloadEvent) => {
      event.preventDefault();
      // Older browsers show the question only when returnValue is set.
      event.returnValue = '';
    };
    window.addEventListener('beforeunload', ask);
    return () => window.removeEventListener('beforeunload', ask);
  }, [when]);

  return (
    <ConfirmDialog
      open={blocker.state === 'blocked'}
      onClose={() => blocker.reset?.()}
      onConfirm={() => blocker.proceed?.()}
      title="Leave this page?"
      description={description}
      confirmLabel="Leave"
      cancelLabel="Stay"
    />
  );
}
