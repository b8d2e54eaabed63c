import { useState, type FormEvent } from 'react';
import type { OrderDetail } from '../../../../shared/schemas/orders';
import { Alert } from '../../../components/ui/alert';
import { Button, LinkButton } from '../../../components/ui/button';
import { Dialog } from '../../../components/ui/dialog';
import { SignatureIcon } from '../../../components/ui/icons';
import { TextField } from '../../../components/ui/text-field';
import { paths } from '../../../config/paths';
import { describeError, isApiRequestError } from '../../../lib/api-client';
import { useSignOrder } from '../hooks/use-sign-order';
import { BodyMeasures } from './body-measures';
import { eyeWords } from './order-words';
import { formatFigure } from './plan-numbers';
import { formatCalendarDate } from '../../../lib/unit-times';

type SignOrderDialogProps = {
  order: OrderDetail;
  open: boolean;
  /** Problems the same rules as the server's find before trying; the server still decides. */
  knownProblems: readonly string[];
  /** Question texts by id, so a problem about `checklist.<id>` names its question. */
  describePath: (path: string) => string;
  onDismiss: () => void;
  onSigned: (order: OrderDetail) => void;
};

const sentence = (message: string) => message.charAt(0).toUpperCase() + message.slice(1);

/** Signing: states what the signature means, asks for the password again, and lists what stops it. */
export function SignOrderDialog({
  order,
  open,
  knownProblems,
  describePath,
  onDismiss,
  onSigned,
}: SignOrderDialogProps) {
  const sign = useSignOrder();
  const [password, setPassword] = useState('');
  const [passwordError, setPasswordError] = useState<string | undefined>();
  // The version on screen when the dialog opened is the one signed: a refresh behind the open
  // dialog must not turn this signature into one for inputs the clinician has not looked at.
  const [versionShown, setVersionShown] = useState(order.version);
  const [wasOpen, setWasOpen] = useState(open);
  if (open !== wasOpen) {
    setWasOpen(open);
    if (open) setVersionShown(order.version);
  }

  const close = () => {
    sign.reset();
    setPassword('');
    setPasswordError(undefined);
    onDismiss();
  };

  const submit = (event: FormEvent) => {
    event.preventDefault();
    if (password === '') {
      setPasswordError('Type your sign-in password to sign');
      return;
    }
    setPasswordError(undefined);
    sign.mutate(
      { id: order.id, password, version: versionShown },
      {
        onSuccess: (signed) => {
          setPassword('');
          sign.reset();
          onSigned(signed);
        },
        onError: (error) => {
          if (isApiRequestError(error)) {
            const problem = error.fields.find((f) => f.path === 'password');
            if (problem)
              setPasswordError('The password is not right; type your sign-in password again');
          }
          setPassword('');
        },
      },
    );
  };

  const error = sign.error;
  const otherProblems = isApiRequestError(error)
    ? error.fields.filter((f) => f.path !== 'password')
    : [];
  const passwordOnly =
    isApiRequestError(error) && error.fields.length > 0 && otherProblems.length === 0;

  return (
    <Dialog
      open={open}
      onDismiss={close}
      dismissible={!sign.isPending}
      title={`Sign order ${order.id}`}
      description={
        <p>
          Your signature means:{' '}
          <strong className="font-semibold text-paper-950">
            “I order this treatment as shown.”
          </strong>{' '}
          It is recorded with your name and the time, and the plan is frozen as the server computes
          it now.
        </p>
      }
    >
      <form onSubmit={submit} noValidate className="flex flex-col gap-4">
        <dl className="grid grid-cols-[max-content_1fr] gap-x-4 gap-y-1 rounded-lg border border-paper-200 bg-white px-4 py-3">
          <dt className="text-paper-600">Patient</dt>
          <dd className="font-medium text-paper-950">
            {order.patient.familyName}, {order.patient.givenName} · {order.patient.recordNumber}
          </dd>
          <dt className="text-paper-600">Date of birth</dt>
          <dd className="font-medium text-paper-950">
            {formatCalendarDate(order.patient.dateOfBirth)}
          </dd>
          <dt className="text-paper-600">Eye</dt>
          <dd className="text-lg font-semibold text-paper-950">{eyeWords[order.eye]}</dd>
          <dt className="text-paper-600">Protocol</dt>
          <dd className="text-paper-950">
            {order.protocol.title}, version {order.protocol.version}
          </dd>
        </dl>

        <section
          aria-labelledby="signed-figures-heading"
          className="rounded-lg border border-iris-200 bg-iris-50 px-4 py-3"
        >
          <h3 id="signed-figures-heading" className="mb-1 font-semibold text-paper-950">
            What you sign for
          </h3>
          <div className="grid gap-y-1 sm:grid-cols-[max-content_max-content] sm:gap-x-10">
            <BodyMeasures
              inputs={order.inputs}
              bmiKgPerM2={order.plan?.bmiKgPerM2}
              className="content-start"
            />
            {order.plan && (
              <dl className="grid content-start grid-cols-[max-content_1fr] gap-x-4 gap-y-1">
                {order.plan.doseMg !== null && order.plan.drugVolumeMl !== null ? (
                  <>
                    <dt className="text-paper-600">Verteporfin dose</dt>
                    <dd className="numerals-steady text-lg font-semibold text-paper-950">
                      {formatFigure(order.plan.doseMg)} mg
                    </dd>
                    <dt className="text-paper-600">Drug volume</dt>
                    <dd className="numerals-steady text-lg font-semibold text-paper-950">
                      {formatFigure(order.plan.drugVolumeMl)} mL
                    </dd>
                    {order.plan.diluentVolumeMl !== null && (
                      <>
                        <dt className="text-paper-600">Diluent</dt>
                        <dd className="numerals-steady text-paper-950">
                          {formatFigure(order.plan.diluentVolumeMl)} mL
                        </dd>
                      </>
                    )}
                  </>
                ) : (
                  <>
                    <dt className="text-paper-600">Drug</dt>
                    <dd className="text-paper-950">None in this protocol</dd>
                  </>
                )}
                {order.plan.fluenceJPerCm2 !== null && (
                  <>
                    <dt className="text-paper-600">Fluence</dt>
                    <dd className="numerals-steady font-semibold text-paper-950">
                      {formatFigure(order.plan.fluenceJPerCm2)} J/cm²
                    </dd>
                  </>
                )}
              </dl>
            )}
          </div>
          <p className="mt-1 text-sm text-paper-700">
            As saved in the draft; the server works the plan out again as you sign.
          </p>
        </section>

        {knownProblems.length > 0 && otherProblems.length === 0 && (
          <Alert
            tone="info"
            title="The server will refuse the signature until these are settled"
            live="none"
          >
            <ul className="list-disc space-y-1 pl-5">
              {knownProblems.map((p) => (
                <li key={p}>{sentence(p)}</li>
              ))}
            </ul>
          </Alert>
        )}

        {error && !passwordOnly && (
          <Alert
            tone="error"
            title={
              otherProblems.length > 0
                ? 'The order was not signed: these must be settled first'
                : 'The order was not signed'
            }
          >
            {otherProblems.length > 0 ? (
              <>
                <ul className="list-disc space-y-1 pl-5">
                  {otherProblems.map((p) => (
                    <li key={p.path}>
                      <span className="font-medium">{describePath(p.path)}: </span>
                      {sentence(p.message)}
                    </li>
                  ))}
                </ul>
                <p className="mt-2">
                  <LinkButton to={paths.orderEdit.getHref(order.id)} size="sm" variant="secondary">
                    Edit the draft to settle them
                  </LinkButton>
                </p>
              </>
            ) : (
              describeError(error)
            )}
          </Alert>
        )}

        <TextField
          label="Your password"
          type="password"
          autoComplete="current-password"
          hint="The password you sign in with, asked again for this signature"
          value={password}
          error={passwordError}
          onChange={(e) => setPassword(e.target.value)}
        />
        <div className="flex flex-wrap justify-end gap-3">
          <Button variant="secondary" onClick={close} disabled={sign.isPending}>
            Cancel
          </Button>
          <Button type="submit" busy={sign.isPending} icon={<SignatureIcon />}>
            {sign.isPending ? 'Signing…' : 'Sign: I order this treatment'}
          </Button>
        </div>
      </form>
    </Dialog>
  );
}
