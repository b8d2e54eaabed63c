import { useEffect, useId, useRef, type ReactNode } from 'react';

type DialogProps = {
  open: boolean;
  /** Called when the person presses Escape or a close button; the owner sets `open` false. */
  onDismiss: () => void;
  title: string;
  description?: ReactNode;
  children: ReactNode;
  /** While a request is running, Escape must not hide the outcome from the person. */
  dismissible?: boolean;
};

/**
 * A modal built on the native <dialog>: the browser traps focus inside it, makes the page behind
 * inert, and returns focus to the control that opened it when it closes.
 */
export function Dialog({
  open,
  onDismiss,
  title,
  description,
  children,
  dismissible = true,
}: DialogProps) {
  const ref = useRef<HTMLDialogElement>(null);
  const titleId = useId();
  const descriptionId = useId();

  useEffect(() => {
    const dialog = ref.current;
    if (!dialog) return;
    if (open && !dialog.open) dialog.showModal();
    if (!open && dialog.open) dialog.close();
  }, [open]);

  return (
    <dialog
      ref={ref}
      aria-labelledby={titleId}
      aria-describedby={description ? descriptionId : undefined}
      onCancel={(event) => {
        event.preventDefault();
        if (dismissible) onDismiss();
      }}
      // The browser may still close the dialog itself (repeated Escape); keep our state in step.
      onClose={() => {
        if (open) onDismiss();
      }}
      className="m-auto w-[min(36rem,calc(100vw-2rem))] max-h-[calc(100dvh-2rem)] overflow-y-auto rounded-2xl border border-paper-300 bg-paper-50 p-0 text-paper-900 shadow-xl"
    >
      {open && (
        <div className="flex flex-col gap-4 p-6">
          <h2 id={titleId} className="text-xl font-semibold">
            {title}
          </h2>
          {description && (
            <div id={descriptionId} className="text-paper-700">
              {description}
            </div>
          )}
          {children}
        </div>
      )}
    </dialog>
  );
}
