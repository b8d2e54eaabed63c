import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { CheckCircleIcon, EnvelopeIcon, InfoIcon } from '../../../components/ui/icons';
import { describeError } from '../../../lib/api-client';
import type { Discharge } from '../api/discharge-schemas';
import { useEmailDischarge } from '../hooks/use-email-discharge';

/**
 * For the nurse: the same advice by e-mail, offered only when the patient agreed to e-mail and
 * has an address. The server checks both again and says why when it refuses.
 */
export function EmailToPatient({ discharge }: { discharge: Discharge }) {
  const email = useEmailDischarge(discharge.order.id);
  const { emailConsent, hasEmail } = discharge.patient;

  if (!emailConsent || !hasEmail) {
    return (
      <p className="flex items-start gap-2 text-sm text-paper-800">
        <InfoIcon className="mt-0.5 size-4" />
        {!emailConsent
          ? 'No e-mail: the patient has not agreed to advice by e-mail.'
          : 'No e-mail: there is no e-mail address on the patient’s record.'}{' '}
        Give the printed sheet.
      </p>
    );
  }

  return (
    <div className="space-y-2">
      <Button
        variant="secondary"
        icon={<EnvelopeIcon />}
        busy={email.isPending}
        onClick={() => email.mutate()}
      >
        {email.isSuccess ? 'E-mail to patient again' : 'E-mail to patient'}
      </Button>
      <div role="status">
        {email.isSuccess && (
          <p className="flex items-center gap-2 text-sm font-medium text-paper-900">
            <CheckCircleIcon className="size-4" />
            Queued: the advice goes to the patient’s e-mail address from the outbox.
          </p>
        )}
      </div>
      {email.isError && (
        <Alert tone="error" title="The e-mail was not sent">
          {describeError(email.error)}
        </Alert>
      )}
    </div>
  );
}
