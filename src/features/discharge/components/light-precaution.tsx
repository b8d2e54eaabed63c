import { AlertIcon, SunShieldIcon } from '../../../components/ui/icons';
import type { Discharge } from '../api/discharge-schemas';
import { dayAndClockText } from './sheet-times';

/**
 * After verteporfin: the one date and time the patient must carry home, large, then what to do
 * until then in plain words. The period and its end come from the server (protocol file).
 */
export function LightPrecaution({ discharge }: { discharge: Discharge }) {
  const { precaution, record, unitTimeZone: zone } = discharge;

  if (!precaution) {
    return (
      <section
        aria-labelledby="precaution-heading"
        className="rounded-2xl border-4 border-alarm-700 bg-alarm-50 px-5 py-4 break-inside-avoid"
      >
        <h2
          id="precaution-heading"
          className="flex items-center gap-2 text-xl font-semibold text-alarm-800"
        >
          <AlertIcon className="size-6" />
          Light precaution: no end time yet
        </h2>
        <p className="mt-1 text-paper-950">
          No start of the verteporfin drip is recorded in this session, so the end of the light
          precaution period cannot be worked out. Ask the clinician before the patient leaves, and
          write the end date and time here: ______________________________
        </p>
      </section>
    );
  }

  return (
    <section
      aria-labelledby="precaution-heading"
      className="space-y-4 rounded-2xl border-4 border-paper-950 bg-white px-5 py-5 break-inside-avoid"
    >
      <h2
        id="precaution-heading"
        className="flex items-center gap-2 text-sm font-semibold tracking-wide text-paper-800 uppercase"
      >
        <SunShieldIcon className="size-6" />
        Light precaution after verteporfin
      </h2>
      <p className="text-2xl leading-snug font-bold text-paper-950 print:text-[18pt]">
        Protect skin and eyes from direct sunlight and bright light until{' '}
        <time
          dateTime={precaution.endUtc}
          data-precaution-end
          className="whitespace-nowrap underline decoration-2 underline-offset-4"
        >
          {precaution.endLocalText}
        </time>
      </p>
      <p className="text-paper-900">
        The medicine you were given makes your skin and eyes sensitive to strong light for{' '}
        {precaution.hours} hours after the drip started
        {record.infusionStartAt && <> ({dayAndClockText(record.infusionStartAt, zone)})</>}. Strong
        light on bare skin in that time can cause a burn like a severe sunburn.
      </p>
      {precaution.note && (
        <p className="flex items-start gap-2 rounded-lg border-2 border-paper-900 px-3 py-2 text-paper-950">
          <AlertIcon className="mt-0.5 size-5 shrink-0" />
          <span>
            <strong className="font-semibold">Counted from the latest plausible time.</strong>{' '}
            {precaution.note}
            {precaution.countedFrom && (
              <> Counted from {dayAndClockText(precaution.countedFrom, zone)}.</>
            )}
          </span>
        </p>
      )}

      <div className="grid gap-x-8 gap-y-4 md:grid-cols-2 print:grid-cols-2">
        <div>
          <h3 className="mb-1.5 font-semibold text-paper-950">Until then</h3>
          <ul className="list-disc space-y-1.5 pl-5 text-paper-900">
            <li>
              Outdoors in daylight, even when it is cloudy, cover all your skin: long sleeves, long
              trousers, socks and closed shoes, gloves, and a hat with a wide brim. Thin or loosely
              woven cloth lets light through; choose thick, dark fabric.
            </li>
            <li>Wear dark glasses whenever you are outdoors in daylight.</li>
            <li>
              Sun cream alone does not protect you: the medicine reacts to visible light, which sun
              cream does not block.
            </li>
            <li>
              Keep away from strong lamps: sunbeds, halogen spotlights, bright lamps close to your
              skin, and examination or dental lights. If you need an operation, a scan with bright
              lights or dental work before the time above, tell the team that you have had
              verteporfin.
            </li>
          </ul>
        </div>
        <div className="space-y-4">
          <div>
            <h3 className="mb-1.5 font-semibold text-paper-950">
              Normal indoor light is good for you
            </h3>
            <p className="text-paper-900">
              Ordinary room light is fine and helps your body clear the medicine from your skin. Do
              not stay in the dark or keep the curtains shut all day; just keep out of direct sun
              through a window.
            </p>
          </div>
          <div>
            <h3 className="mb-1.5 font-semibold text-paper-950">
              If your skin is caught in bright light
            </h3>
            <p className="text-paper-900">
              If it tingles, turns red or feels hot: go indoors or into deep shade at once, cover
              the area and cool it with cool water or a cool damp cloth. Call us if blisters,
              swelling or a burn appear, or if the redness has not settled by the next day.
            </p>
          </div>
        </div>
      </div>
    </section>
  );
}

/** After PDT, about the eye itself. */
export function PdtEyeAdvice() {
  return (
    <section aria-labelledby="eye-advice-heading" className="space-y-2 break-inside-avoid">
      <h2 id="eye-advice-heading" className="text-xl font-semibold text-paper-950">
        Your eye
      </h2>
      <ul className="list-disc space-y-1.5 pl-5 text-paper-900">
        <li>
          Your sight in the treated eye may be blurred, dim or patchy for a few days. This usually
          settles.
        </li>
        <li>
          Do not drive today: the eye drops that widened your pupil blur your sight for some hours.
        </li>
        <li>Keep taking your usual medicines unless your doctor has told you otherwise.</li>
      </ul>
      <p className="font-semibold text-paper-950">
        Call us the same day if your sight gets much worse suddenly, or if your eye becomes painful.
      </p>
    </section>
  );
}
