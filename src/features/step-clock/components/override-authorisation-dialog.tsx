import { useQueryClient } from '@tanstack/react-query';
import { useId, useState } from 'react';
import { Button } from '../../../components/ui/button';
import { Dialog } from '../../../components/ui/dialog';
import { AlertIcon } from '../../../components/ui/icons';
import { FieldError, TextField } from '../../../components/ui/text-field';
import { describeError, isApiRequestError } from '../../../lib/api-client';
import { serverNowMs } from '../api/clock-offset';
import { newIdempotencyKey } from '../api/tap-store';
import { recordSessionEvent } from '../api/record-session-event';
import { stepClockQueries } from '../api/step-clock-queries';
import { useStoredDraft } from '../hooks/use-stored-draft';

const reasonMinChars = 5;
const reasonMaxChars = 500;

/**
 * UV below the thickness minimum needs a second person: a clinician, not the nurse, types their
 * e-mail and password on the tablet. This one tap goes straight to the server and never into the
 * tablet's queue, so the password is never kept on the tablet; without the network it cannot be made.
 */
export function OverrideAuthorisationDialog({
  open,
  orderId,
  minimumUm,
  onDismiss,
  onRecorded,
}: {
  open: boolean;
  orderId: number;
  minimumUm: number | null;
  onDismiss: () => void;
  onRecorded: () => void;
}) {
  const queryClient = useQueryClient();
  const [reason, setReason, clearReason] = useStoredDraft(`override.${orderId}`, '');
  const [email, setEmail] = useState('');
  const [password, setPassword] = useState('');
  const [errors, setErrors] = useState<{
    reason?: string;
    authoriserEmail?: string;
    authoriserPassword?: string;
    other?: string;
  }>({});
  const [busy, setBusy] = useState(false);
  const reasonId = useId();

  const submit = async () => {
    const trimmed = reason.trim();
    const next: typeof errors = {};
    if (trimmed.length < reasonMinChars || trimmed.length > reasonMaxChars)
      next.reason = `Give a reason of ${reasonMinChars} to ${reasonMaxChars} characters (now ${trimmed.length}).`;
    if (email.trim() === '')
      next.authoriserEmail = 'Enter the e-mail of the clinician who authorises it.';
    if (password === '')
      next.authoriserPassword = 'The clinician types their own sign-in password.';
    setErrors(next);
    if (Object.keys(next).length > 0) return;
    setBusy(true);
    try {
      await recordSessionEvent(orderId, {
        type: 'thickness-override',
        idempotencyKey: newIdempotencyKey(),
        clientTime: new Date(Math.round(serverNowMs())).toISOString(),
        reason: trimmed,
        authoriserEmail: email.trim(),
        authoriserPassword: password,
      });
      clearReason();
      setEmail('');
      setPassword('');
      setErrors({});
      await queryClient.invalidateQueries({ queryKey: stepClockQueries.session(orderId).queryKey });
      onRecorded();
    } catch (error) {
      setPassword('');
      // The server's sentence is written for people; it goes beside the field it names.
      const fields = isApiRequestError(error) ? error.fields : [];
      const byField: typeof errors = {};
      for (const field of fields)
        if (
          field.path === 'authoriserEmail' ||
          field.path === 'authoriserPassword' ||
          field.path === 'reason'
        )
          byField[field.path] = describeError(error);
      const offline = isApiRequestError(error) && error.status === 0;
      setErrors(
        Object.keys(byField).length > 0
          ? byField
          : {
              other: offline
                ? 'The tablet is offline: an authorisation needs the network. Try again when it is back.'
                : describeError(error),
            },
      );
    } finally {
      setBusy(false);
    }
  };

  return (
    <Dialog
      open={open}
      onDismiss={onDismiss}
      dismissible={!busy}
      title="Authorise UV below the thickness minimum"
      description={`The stroma is thinner than the protocol’s ${minimumUm ?? ''} µm minimum; UV on a thin stroma can harm the endothelium. A clinician other than the nurse authorises going on with their password; it is recorded as their act and as a deviation for the auditor.`}
    >
      <form
        className="flex flex-col gap-3"
        onSubmit={(event) => {
          event.preventDefault();
          void submit();
        }}
      >
        <div className="flex flex-col gap-1.5">
          <label htmlFor={reasonId} className="font-medium text-paper-900">
            Reason for going on to UV
          </label>
          <textarea
            id={reasonId}
            rows={2}
            maxLength={reasonMaxChars}
            value={reason}
            aria-invalid={errors.reason ? true : undefined}
            aria-describedby={errors.reason ? `${reasonId}-error` : undefined}
            onChange={(event) => setReason(event.target.value)}
            className={`w-full rounded-lg border bg-white px-3 py-2 text-base text-paper-950 ${errors.reason ? 'border-2 border-alarm-700' : 'border-paper-500'}`}
          />
          <FieldError id={`${reasonId}-error`} message={errors.reason} />
        </div>
        <TextField
          label="Authorising clinician’s e-mail"
          type="email"
          autoComplete="off"
          value={email}
          error={errors.authoriserEmail}
          onChange={(event) => setEmail(event.target.value)}
        />
        <TextField
          label="Authorising clinician’s password"
          type="password"
          autoComplete="off"
          value={password}
          error={errors.authoriserPassword}
          onChange={(event) => setPassword(event.target.value)}
        />
        {errors.other && (
          <p role="alert" className="flex items-start gap-1.5 font-medium text-alarm-700">
            <AlertIcon className="mt-0.5 size-5 shrink-0" />
            {errors.other}
          </p>
        )}
        <div className="flex flex-wrap justify-end gap-3">
          <Button variant="secondary" onClick={onDismiss} disabled={busy}>
            Go back
          </Button>
          <Button type="submit" variant="danger" busy={busy}>
            Authorise override
          </Button>
        </div>
      </form>
    </Dialog>
  );
}
