import { useState, type FormEvent } from 'react';
import {
  reasonOfSubstanceProblem,
  minimumSubstantialReasonChars,
  minimumSubstantialReasonWords,
} from '../../../../shared/orders/reason-of-substance';
import type { Eye } from '../../../../shared/schemas/patients';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { Dialog } from '../../../components/ui/dialog';
import { CrossCircleIcon } from '../../../components/ui/icons';
import { TextAreaField } from '../../../components/ui/text-area-field';
import { describeError, isApiRequestError } from '../../../lib/api-client';
import type { CancelledOrder } from '../api/cancel-order';
import { useCancelOrder } from '../hooks/use-cancel-order';
import { eyeWords } from './order-words';

/** What identifies the order in the dialog: the detail page's order or the administrator's row. */
export type CancelTarget = {
  id: number;
  version: number;
  eye: Eye;
  patient: { familyName: string; givenName: string; recordNumber: string };
};

type CancelOrderDialogProps = {
  order: CancelTarget;
  /** The treatment, as the screen names it (the protocol's title, or the kind of treatment). */
  treatment: string;
  open: boolean;
  onDismiss: () => void;
  onCancelled: (order: CancelledOrder) => void;
};

const sentence = (message: string) => message.charAt(0).toUpperCase() + message.slice(1);
const cancelWhy = 'why the order is cancelled';

/** Cancelling before the session: the reason is checked here as the server checks it. */
export function CancelOrderDialog({
  order,
  treatment,
  open,
  onDismiss,
  onCancelled,
}: CancelOrderDialogProps) {
  const cancel = useCancelOrder();
  const [reason, setReason] = useState('');
  const [reasonError, setReasonError] = useState<string | undefined>();

  const close = () => {
    cancel.reset();
    setReasonError(undefined);
    onDismiss();
  };

  const submit = (event: FormEvent) => {
    event.preventDefault();
    const weak = reasonOfSubstanceProblem(reason, undefined, cancelWhy);
    if (weak) {
      setReasonError(sentence(weak));
      return;
    }
    setReasonError(undefined);
    cancel.mutate(
      { id: order.id, reason, version: order.version },
      {
        onSuccess: (cancelled) => {
          setReason('');
          cancel.reset();
          onCancelled(cancelled);
        },
        onError: (error) => {
          const problem = isApiRequestError(error)
            ? error.fields.find((f) => f.path === 'reason')
            : undefined;
          if (problem) setReasonError(sentence(problem.message));
        },
      },
    );
  };

  const error = cancel.error;
  const shownBeside = isApiRequestError(error) && error.fields.some((f) => f.path === 'reason');

  return (
    <Dialog
      open={open}
      onDismiss={close}
      dismissible={!cancel.isPending}
      title={`Cancel order ${order.id}`}
      description={
        <p>
          The order leaves every worklist and can no longer be checked, prepared or started. It
          stays on record with your name, the time and your reason. This cannot be undone: a new
          order is needed to treat.
        </p>
      }
    >
      <form onSubmit={submit} noValidate className="flex flex-col gap-4">
        <p className="rounded-lg border border-paper-200 bg-white px-4 py-3 text-paper-950">
          {order.patient.familyName}, {order.patient.givenName} · {order.patient.recordNumber} ·{' '}
          <strong>{eyeWords[order.eye]}</strong> · {treatment}
        </p>
        {error && !shownBeside && (
          <Alert tone="error" title="The order was not cancelled">
            {describeError(error)}
          </Alert>
        )}
        <TextAreaField
          label="Reason for cancelling (required)"
          hint={`At least ${minimumSubstantialReasonChars} characters and ${minimumSubstantialReasonWords} words, e.g. what changed and who decided`}
          rows={3}
          value={reason}
          error={reasonError}
          onChange={(e) => setReason(e.target.value)}
        />
        <div className="flex flex-wrap justify-end gap-3">
          <Button variant="secondary" onClick={close} disabled={cancel.isPending}>
            Keep the order
          </Button>
          <Button type="submit" variant="danger" busy={cancel.isPending} icon={<CrossCircleIcon />}>
            {cancel.isPending ? 'Cancelling…' : 'Cancel this order'}
          </Button>
        </div>
      </form>
    </Dialog>
  );
}
