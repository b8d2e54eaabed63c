/** After cross-linking: the first days of healing, and when to call. */
export function CxlAftercare() {
  return (
    <>
      <section aria-labelledby="aftercare-heading" className="space-y-2 break-inside-avoid">
        <h2 id="aftercare-heading" className="text-xl font-semibold text-paper-950">
          Looking after your eye
        </h2>
        <ul className="list-disc space-y-1.5 pl-5 text-paper-900">
          <li>
            A soft bandage contact lens is on your eye to protect the surface while it heals. Leave
            it in; we take it out at your check-up. If it falls out, do not put it back in — call
            us.
          </li>
          <li>
            Use your eye drops exactly as your prescription says. Wash your hands first, do not let
            the bottle tip touch the eye, and leave about five minutes between two different drops.
          </li>
          <li>
            For the first two or three days expect the eye to be sore, watery and sensitive to
            light, and your sight to be blurred. Take the pain relief you were advised; dark glasses
            can help.
          </li>
          <li>
            Do not rub or press on the eye. If you were given an eye shield, wear it at night.
          </li>
          <li>
            Keep soap, shampoo and make-up out of the eye, and do not swim until we say the surface
            has healed.
          </li>
          <li>Do not drive until we tell you your sight is good enough.</li>
        </ul>
      </section>
      <section aria-labelledby="call-us-heading" className="space-y-2 break-inside-avoid">
        <h2 id="call-us-heading" className="text-xl font-semibold text-paper-950">
          Call us straight away if
        </h2>
        <ul className="list-disc space-y-1.5 pl-5 text-paper-900">
          <li>the pain gets worse after the second day instead of easing;</li>
          <li>the eye becomes redder, or a sticky, yellow or green discharge appears;</li>
          <li>your sight gets worse suddenly;</li>
          <li>the bandage lens falls out.</li>
        </ul>
      </section>
    </>
  );
}
