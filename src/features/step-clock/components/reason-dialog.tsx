import { useId, useState, type ReactNode } from 'react';
import { Button } from '../../../components/ui/button';
import { Dialog } from '../../../components/ui/dialog';
import { FieldError } from '../../../components/ui/text-field';
import { useStoredDraft } from '../hooks/use-stored-draft';

const reasonMinChars = 5;
const reasonMaxChars = 500;

/**
 * Asks for a reason before a tap that needs one (stopping the session, overriding the thickness
 * minimum). The typed reason is kept if the dialog closes or the tab reloads.
 */
export function ReasonDialog({
  open,
  onDismiss,
  title,
  description,
  fieldLabel,
  confirmLabel,
  confirmIcon,
  draftKey,
  danger = false,
  children,
  checkOthers,
  onConfirm,
}: {
  open: boolean;
  onDismiss: () => void;
  title: string;
  description: ReactNode;
  fieldLabel: string;
  confirmLabel: string;
  confirmIcon?: ReactNode;
  draftKey: string;
  danger?: boolean;
  /** Further fields shown above the reason (e.g. the volume infused at a PDT stop). */
  children?: ReactNode;
  /** Checks those fields; false keeps the dialog open (they show their own errors). */
  checkOthers?: () => boolean;
  onConfirm: (reason: string) => void;
}) {
  const [reason, setReason, clearReason] = useStoredDraft(draftKey, '');
  const [error, setError] = useState<string | undefined>();
  const id = useId();

  const confirm = () => {
    const trimmed = reason.trim();
    const othersFine = checkOthers ? checkOthers() : true;
    if (trimmed.length < reasonMinChars || trimmed.length > reasonMaxChars) {
      setError(
        `Give a reason of ${reasonMinChars} to ${reasonMaxChars} characters (now ${trimmed.length}).`,
      );
      document.getElementById(id)?.focus();
      return;
    }
    setError(undefined);
    if (!othersFine) return;
    setError(undefined);
    clearReason();
    onConfirm(trimmed);
  };

  return (
    <Dialog open={open} onDismiss={onDismiss} title={title} description={description}>
      {children}
      <div className="flex flex-col gap-1.5">
        <label htmlFor={id} className="font-medium text-paper-900">
          {fieldLabel}
        </label>
        <p id={`${id}-hint`} className="text-sm text-paper-600">
          {reasonMinChars} to {reasonMaxChars} characters; it goes into the record and to the
          auditor.
        </p>
        <textarea
          id={id}
          value={reason}
          rows={3}
          maxLength={reasonMaxChars}
          aria-invalid={error ? true : undefined}
          aria-describedby={`${id}-hint${error ? ` ${id}-error` : ''}`}
          onChange={(event) => setReason(event.target.value)}
          className={`w-full rounded-lg border bg-white px-3 py-2 text-base text-paper-950 ${error ? 'border-2 border-alarm-700' : 'border-paper-500'}`}
        />
        <FieldError id={`${id}-error`} message={error} />
      </div>
      <div className="flex flex-wrap justify-end gap-3">
        <Button variant="secondary" onClick={onDismiss}>
          Go back
        </Button>
        <Button variant={danger ? 'danger' : 'primary'} icon={confirmIcon} onClick={confirm}>
          {confirmLabel}
        </Button>
      </div>
    </Dialog>
  );
}
