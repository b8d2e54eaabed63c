import { useState } from 'react';
import { identityChecks, type IdentityCheck } from '../../../../shared/session/session-events';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { Dialog } from '../../../components/ui/dialog';
import { StartCircleIcon } from '../../../components/ui/icons';
import { formatCalendarDate } from '../../../lib/unit-times';
import type { SessionOrder } from '../api/get-session-order';
import { EyeBadge, eyeWords } from './eye-badge';
import { CheckToggle } from './pre-treatment-checks';

type Ticks = Record<IdentityCheck, boolean>;
const noTicks: Ticks = { patientName: false, dateOfBirth: false, treatmentEye: false };

/**
 * The protocol's "identity and eye again before the light": name, date of birth and eye are asked
 * and ticked before the light or UV starts. The confirmation is stored as its own event (who and
 * when), and the server refuses the start without it.
 */
export function IdentityConfirmationDialog({
  open,
  order,
  what,
  onDismiss,
  onConfirm,
}: {
  open: boolean;
  order: SessionOrder;
  /** "laser" or "UV", as the start button names it. */
  what: string;
  onDismiss: () => void;
  onConfirm: () => void;
}) {
  const [ticks, setTicks] = useState<Ticks>(noTicks);
  const [missing, setMissing] = useState(false);
  const patient = `${order.patient.givenName} ${order.patient.familyName}`;
  const born = formatCalendarDate(order.patient.dateOfBirth);
  const words: Record<IdentityCheck, { label: string; detail: string }> = {
    patientName: {
      label: `Name: ${patient}`,
      detail: `The patient says their name; it matches the wristband (record ${order.patient.recordNumber}).`,
    },
    dateOfBirth: {
      label: `Date of birth: ${born}`,
      detail: 'The patient says their date of birth; it matches the wristband.',
    },
    treatmentEye: {
      label: `Treatment eye: ${eyeWords[order.eye]}`,
      detail: 'The eye under the light is the marked eye on the order.',
    },
  };

  const close = () => {
    setTicks(noTicks);
    setMissing(false);
    onDismiss();
  };
  const confirm = () => {
    if (identityChecks.some((check) => !ticks[check])) {
      setMissing(true);
      return;
    }
    setTicks(noTicks);
    setMissing(false);
    onConfirm();
  };

  return (
    <Dialog
      open={open}
      onDismiss={close}
      title={`Before the ${what}: identity and eye again`}
      description="Ask the patient, read the wristband, look at the marked eye, then tick each."
    >
      <EyeBadge eye={order.eye} />
      <ul className="flex flex-col gap-2">
        {identityChecks.map((check) => (
          <li key={check}>
            <CheckToggle
              label={words[check].label}
              detail={words[check].detail}
              checked={ticks[check]}
              inputRef={() => undefined}
              onChange={(checked) => {
                setTicks({ ...ticks, [check]: checked });
                setMissing(false);
              }}
            />
          </li>
        ))}
      </ul>
      {missing && (
        <Alert tone="error" title={`The ${what} cannot start yet`}>
          Tick name, date of birth and eye once each is confirmed.
        </Alert>
      )}
      <div className="flex flex-wrap justify-end gap-3">
        <Button variant="secondary" onClick={close}>
          Go back
        </Button>
        <Button icon={<StartCircleIcon />} onClick={confirm}>
          Confirmed: start {what}
        </Button>
      </div>
    </Dialog>
  );
}
