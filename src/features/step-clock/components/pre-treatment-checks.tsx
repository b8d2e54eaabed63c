import { useId, useRef, useState, type ReactNode } from 'react';
import { drugTimeVerdict } from '../../../../shared/session/session-rules';
import type { ProtocolVersion } from '../../../../shared/protocol/protocol-schema';
import type { DosePlan } from '../../../../shared/schemas/calculation';
import {
  preTreatmentChecks,
  type PreTreatmentCheck,
} from '../../../../shared/session/session-events';
import { AcceptedCautionsBanner } from '../../../components/ui/accepted-cautions-banner';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { CheckCircleIcon, DraftCircleIcon, StartCircleIcon } from '../../../components/ui/icons';
import { formatCalendarDate } from '../../../lib/unit-times';
import type { SessionOrder } from '../api/get-session-order';
import { useStoredDraft } from '../hooks/use-stored-draft';
import { formatWardTime } from './clock-format';
import { DevicePreCheck, type DeviceChoice } from './device-pre-check';
import { DeviceSettings } from './device-settings';
import type { DeviceSetting } from '../../../../shared/schemas/devices';
import { EyeBadge, eyeWords } from './eye-badge';
import { SessionCautions } from './session-cautions';

type Ticks = Record<PreTreatmentCheck, boolean>;
const noTicks: Ticks = {
  patientIdentity: false,
  treatmentEye: false,
  consent: false,
  eyewear: false,
  deviceSettings: false,
};

function checkWords(
  order: SessionOrder,
  protocol: ProtocolVersion,
): Record<PreTreatmentCheck, { label: string; detail: string }> {
  const patient = `${order.patient.givenName} ${order.patient.familyName}`;
  return {
    patientIdentity: {
      label: 'Patient identity confirmed',
      detail: `Asked the patient’s name and date of birth and checked the wristband: ${patient}, born ${formatCalendarDate(order.patient.dateOfBirth)}, record ${order.patient.recordNumber}.`,
    },
    treatmentEye: {
      label: `Treatment eye confirmed: ${eyeWords[order.eye]}`,
      detail: 'The eye on the order, the marked eye and the patient’s own answer agree.',
    },
    consent: {
      label: 'Consent confirmed',
      detail: 'Signed consent for this treatment is in the record.',
    },
    eyewear: {
      label: 'Protective eyewear on everyone in the room',
      detail:
        protocol.kind === 'pdt'
          ? `Rated for the ${protocol.light.wavelengthNm} nm laser, patient and staff.`
          : 'UV protection for staff; the other eye is covered.',
    },
    deviceSettings: {
      label: 'Device settings match the plan',
      detail: 'Each figure on the device display was read against the plan’s settings shown here.',
    },
  };
}

/**
 * The five pre-treatment checks, each a large toggle. Ticks survive a reload of the tab; the
 * session starts only when all five are confirmed, and the first missing one takes focus.
 */
export function PreTreatmentChecks({
  order,
  protocol,
  plan,
  serverNowMs,
  onStart,
}: {
  order: SessionOrder;
  protocol: ProtocolVersion;
  plan: DosePlan;
  serverNowMs: number;
  /** Starts the session with the device chosen and set (every start names its device). */
  onStart: (device: DeviceSetting) => void;
}) {
  const [ticks, setTicks, clearTicks] = useStoredDraft<Ticks>(`checks.${order.id}`, noTicks);
  const [missing, setMissing] = useState<PreTreatmentCheck[]>([]);
  const inputs = useRef<Partial<Record<PreTreatmentCheck, HTMLInputElement | null>>>({});
  const words = checkWords(order, protocol);
  const settingsHeading = useId();
  const cautionsHeading = useId();
  const beyondUseMs = order.beyondUseAt ? Date.parse(order.beyondUseAt) : null;
  const [device, setDevice] = useState<DeviceChoice>({ setting: null, ready: false });
  const [deviceProblem, setDeviceProblem] = useState<string | null>(null);

  const start = () => {
    // The server refuses a session start after the beyond-use time; the screen says why first.
    if (
      order.beyondUseAt &&
      !drugTimeVerdict('session', serverNowMs, {
        reconstitutedAt: null,
        beyondUseAt: order.beyondUseAt,
      }).allowed
    )
      return;
    const notYet = preTreatmentChecks.filter((check) => !ticks[check]);
    setMissing(notYet);
    const deviceNotReady =
      device.setting === null
        ? `choose the ${protocol.kind === 'pdt' ? 'laser' : 'UV source'} and type what is set on it`
        : protocol.kind === 'pdt' &&
            order.inputs.lensId === undefined &&
            device.setting.lensId === undefined
          ? 'choose the contact lens on the eye'
          : !device.ready
            ? 'the device has no passing output check today (record one above)'
            : null;
    setDeviceProblem(deviceNotReady);
    if (notYet.length > 0) {
      inputs.current[notYet[0]!]?.focus();
      return;
    }
    if (deviceNotReady || device.setting === null) return;
    clearTicks();
    onStart(device.setting);
  };

  return (
    <div className="grid gap-6 lg:grid-cols-[minmax(0,1.15fr)_minmax(0,1fr)]">
      <section aria-labelledby="pre-treatment-checks-heading" className="flex flex-col gap-3">
        <h2 id="pre-treatment-checks-heading" className="text-xl font-semibold text-paper-950">
          Confirm each check aloud, then tick it
        </h2>
        <AcceptedCautionsBanner cautions={order.answeredCautions} />
        <DevicePreCheck
          orderId={order.id}
          protocol={protocol}
          plan={plan}
          lens={{
            id: order.inputs.lensId,
            laserSpotFactor: order.inputs.lensMagnification ?? null,
          }}
          onChange={(choice) => {
            setDevice(choice);
            setDeviceProblem(null);
          }}
        />
        <ul className="flex flex-col gap-3">
          {preTreatmentChecks.map((check) => (
            <li key={check}>
              <CheckToggle
                label={words[check].label}
                detail={words[check].detail}
                checked={ticks[check]}
                inputRef={(element) => {
                  inputs.current[check] = element;
                }}
                onChange={(checked) => {
                  setTicks({ ...ticks, [check]: checked });
                  if (checked) setMissing((current) => current.filter((item) => item !== check));
                }}
              />
            </li>
          ))}
        </ul>
        {/* Kept in view at the bottom of the screen: on a 1024×768 tablet the five checks run
            past the fold, and the start, with what still blocks it, must never need a scroll. */}
        <div
          data-testid="session-start-bar"
          className="sticky bottom-0 z-10 -mx-2 flex flex-col gap-3 border-t border-paper-200 bg-paper-50 px-2 py-3"
        >
          {(missing.length > 0 || deviceProblem) && (
            <Alert tone="error" title="The session cannot start yet">
              {missing.length > 0 &&
                `Not confirmed: ${missing.map((check) => words[check].label.toLowerCase()).join('; ')}. `}
              {deviceProblem && `Device: ${deviceProblem}.`}
            </Alert>
          )}
          <Button
            className="min-h-16 px-8 text-xl"
            icon={<StartCircleIcon className="size-7" />}
            onClick={start}
          >
            Start session
          </Button>
        </div>
      </section>

      <div className="flex flex-col gap-4">
        <div className="flex flex-col items-start gap-2 rounded-2xl border border-paper-300 bg-white px-5 py-4">
          <p className="text-paper-700">Treatment eye</p>
          <EyeBadge eye={order.eye} size="huge" />
          <p className="text-lg font-medium text-paper-950">
            {order.patient.givenName} {order.patient.familyName} · born{' '}
            {formatCalendarDate(order.patient.dateOfBirth)} · record {order.patient.recordNumber}
          </p>
        </div>
        {beyondUseMs !== null && <BeyondUse beyondUseMs={beyondUseMs} serverNowMs={serverNowMs} />}
        <DeviceSettings
          protocol={protocol}
          plan={plan}
          headingId={settingsHeading}
          lensText={
            order.inputs.lensMagnification === undefined
              ? null
              : `${order.inputs.lensId !== undefined ? 'the order’s lens, ' : 'the lens named in the device check, '}laser-spot factor × ${order.inputs.lensMagnification}`
          }
        />
        <SessionCautions
          protocol={protocol}
          eyeWord={eyeWords[order.eye]}
          headingId={cautionsHeading}
        />
      </div>
    </div>
  );
}

function BeyondUse({ beyondUseMs, serverNowMs }: { beyondUseMs: number; serverNowMs: number }) {
  if (serverNowMs >= beyondUseMs) {
    return (
      <Alert tone="error" title="The prepared drug is past its beyond-use time" live="none">
        It was usable until {formatWardTime(beyondUseMs, false)}. Do not infuse it: it is discarded,
        and a pharmacist makes it up again (Preparation, on the order). The session starts once the
        fresh preparation is recorded.
      </Alert>
    );
  }
  return (
    <p className="flex items-center gap-2 text-paper-800">
      <CheckCircleIcon className="size-5" />
      Prepared drug usable until{' '}
      <strong className="numerals-steady">{formatWardTime(beyondUseMs, false)}</strong>
    </p>
  );
}

export function CheckToggle({
  label,
  detail,
  checked,
  onChange,
  inputRef,
}: {
  label: string;
  detail: string;
  checked: boolean;
  onChange: (checked: boolean) => void;
  inputRef: (element: HTMLInputElement | null) => void;
}) {
  const id = useId();
  const state: ReactNode = checked ? (
    <>
      <CheckCircleIcon className="size-6" /> Confirmed
    </>
  ) : (
    <>
      <DraftCircleIcon className="size-6" /> Not yet
    </>
  );
  return (
    <div
      className={`flex min-h-20 items-center gap-4 rounded-2xl border-2 px-4 py-3 ${checked ? 'border-iris-700 bg-iris-50' : 'border-paper-400 bg-white'}`}
    >
      <input
        id={id}
        ref={inputRef}
        type="checkbox"
        checked={checked}
        aria-describedby={`${id}-detail`}
        onChange={(event) => onChange(event.target.checked)}
        className="size-8 shrink-0 cursor-pointer accent-iris-700"
      />
      <div className="min-w-0 flex-1">
        {/* The name stays short ("Consent confirmed"); the detail is read after it. */}
        <label htmlFor={id} className="block cursor-pointer text-lg font-semibold text-paper-950">
          {label}
        </label>
        <p id={`${id}-detail`} className="text-sm text-paper-700">
          {detail}
        </p>
      </div>
      <span
        aria-hidden="true"
        className={`flex shrink-0 items-center gap-1.5 font-medium ${checked ? 'text-iris-800' : 'text-paper-700'}`}
      >
        {state}
      </span>
    </div>
  );
}
