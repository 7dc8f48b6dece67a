import { useEffect, useId, useRef, type KeyboardEvent, type ReactNode } from 'react';
import { cn } from '@client/lib/cn';
import { Button } from './button';
import { Notice } from './notice';

const FOCUSABLE =
  'a[href], button:not([disabled]), input:not([disabled]):not([type="hidden"]), select:not([disabled]), textarea:not([disabled]), [tabindex]:not([tabindex="-1"])';

type Size = 'sm' | 'md' | 'xl';
const sizes: Record<Size, string> = {
  sm: 'w-[min(92vw,28rem)]',
  md: 'w-[min(92vw,36rem)]',
  xl: 'w-[min(96vw,80rem)]',
};

export interface ModalDialogProps {
  open: boolean;
  onClose: () => void;
  /** The visible heading, which is also the dialog's accessible name. */
  title: ReactNode;
  children: ReactNode;
  /** Extra words read out with the name (the question a confirm step asks). */
  description?: ReactNode;
  size?: Size;
  /** Keys the dialog's content handles itself (arrow keys in a photo viewer). */
  onKeyDown?: (event: KeyboardEvent<HTMLDialogElement>) => void;
  className?: string;
}

/**
 * A modal dialog on the browser's own <dialog> element: the page behind is
 * inert, Escape closes, Tab and Shift+Tab stay inside, and focus goes back to
 * whatever opened it. Focus starts on the element marked data-autofocus, else
 * on the first control. Content is rendered only while it is open.
 */
export function ModalDialog({ open, onClose, title, children, description, size = 'md', onKeyDown, className }: ModalDialogProps) {
  const ref = useRef<HTMLDialogElement>(null);
  const opener = useRef<HTMLElement | null>(null);
  const titleId = useId();
  const descriptionId = useId();

  useEffect(() => {
    const dialog = ref.current;
    if (!dialog) return;
    if (open && !dialog.open) {
      opener.current = document.activeElement instanceof HTMLElement ? document.activeElement : null;
      dialog.showModal();
      const target = dialog.querySelector<HTMLElement>('[data-autofocus]') ?? dialog.querySelector<HTMLElement>(FOCUSABLE);
      target?.focus();
    } else if (!open) {
      if (dialog.open) dialog.close();
      opener.current?.focus();
      opener.current = null;
    }
  }, [open]);

  // Closing because the owner unmounts (a confirmed action re-renders the page) still hands focus back.
  useEffect(() => () => opener.current?.focus(), []);

  const trapTab = (event: KeyboardEvent<HTMLDialogElement>) => {
    onKeyDown?.(event);
    if (event.defaultPrevented || event.key !== 'Tab' || !ref.current) return;
    const items = [...ref.current.querySelectorAll<HTMLElement>(FOCUSABLE)].filter((el) => el.offsetParent !== null);
    if (items.length === 0) {
      event.preventDefault();
      return;
    }
    const first = items[0];
    const last = items[items.length - 1];
    if (event.shiftKey && document.activeElement === first) {
      event.preventDefault();
      last.focus();
    } else if (!event.shiftKey && document.activeElement === last) {
      event.preventDefault();
      first.focus();
    }
  };

  return (
    <dialog
      ref={ref}
      aria-labelledby={titleId}
      aria-describedby={description ? descriptionId : undefined}
      onCancel={(event) => {
        // Escape: let React's state close it, so the two never disagree.
        event.preventDefault();
        onClose();
      }}
      onClose={() => {
        // The browser may close it by itself (a second Escape); tell the owner.
        if (open) onClose();
      }}
      onClick={(event) => {
        // A click on the dimmed backdrop lands on the <dialog> itself.
        if (event.target === ref.current) onClose();
      }}
      onKeyDown={trapTab}
      className={cn(
        'm-auto max-h-[94vh] overflow-visible rounded-card bg-paper-raised p-0 text-ink shadow-card backdrop:bg-ink/70',
        sizes[size],
        className,
      )}
    >
      {open && (
        <div className="flex max-h-[94vh] flex-col gap-4 overflow-y-auto p-6">
          <h2 id={titleId} className="text-xl font-bold tracking-tight">
            {title}
          </h2>
          {description && (
            <div id={descriptionId} className="text-ink-soft">
              {description}
            </div>
          )}
          {children}
        </div>
      )}
    </dialog>
  );
}

export interface ConfirmDialogProps {
  open: boolean;
  onClose: () => void;
  onConfirm: () => void;
  title: string;
  /** What will happen, in plain words. */
  description: ReactNode;
  confirmLabel: string;
  cancelLabel?: string;
  tone?: 'primary' | 'danger';
  busy?: boolean;
  error?: string;
  /** The request the confirm runs: while it is under way the button is busy, and its error shows in the dialog. */
  mutation?: { isPending: boolean; error: { message: string } | null };
  /** Optional inputs (a reason) between the question and the buttons. */
  children?: ReactNode;
}

/** A yes-or-no step before something that cannot be undone. Focus starts on the safe choice. */
export function ConfirmDialog({
  open,
  onClose,
  onConfirm,
  title,
  description,
  confirmLabel,
  cancelLabel = 'Go back',
  tone = 'primary',
  mutation,
  busy = mutation?.isPending ?? false,
  error = mutation?.error?.message,
  children,
}: ConfirmDialogProps) {
  return (
    <ModalDialog open={open} onClose={onClose} title={title} description={description} size="sm">
      {children}
      {error && <Notice tone="error">{error}</Notice>}
      <div className="flex flex-wrap justify-end gap-3">
        <Button variant="secondary" onClick={onClose} data-autofocus={children ? undefined : true}>
          {cancelLabel}
        </Button>
        <Button variant={tone} busy={busy} onClick={onConfirm}>
          {confirmLabel}
        </Button>
      </div>
    </ModalDialog>
  );
}
