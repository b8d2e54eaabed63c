import type { ProtocolVersion } from '../../../../shared/protocol/protocol-schema';
import { ShieldEyeIcon } from '../../../components/ui/icons';

/** The cautions of every treatment session, in our words, then the protocol version's own. */
export function sessionCautionLines(protocol: ProtocolVersion, eyeWord: string): string[] {
  const isPdt = protocol.kind === 'pdt';
  return [
    isPdt
      ? `Everyone in the room wears eye protection rated for the ${protocol.light.wavelengthNm} nm laser.`
      : 'Everyone in the room wears UV eye protection; the other eye is covered.',
    `Confirm the patient’s identity and the treatment eye (${eyeWord}) against the order before treatment starts.`,
    ...(isPdt
      ? [
          'After verteporfin the patient is photosensitive: skin and eyes are kept from sunlight and bright light until the precaution period on the discharge sheet ends.',
          'Extravasation: stop the infusion, apply a cool compress and protect the area from light.',
        ]
      : []),
    'Local policy, the product labelling and licensed practice prevail over the numbers shown here.',
  ];
}

export function SessionCautions({
  protocol,
  eyeWord,
  compact = false,
  headingId,
}: {
  protocol: ProtocolVersion;
  eyeWord: string;
  compact?: boolean;
  headingId: string;
}) {
  return (
    <aside
      aria-labelledby={headingId}
      className={`rounded-2xl border border-paper-300 bg-paper-100 text-paper-900 ${compact ? 'px-4 py-3' : 'px-5 py-4'}`}
    >
      <h2 id={headingId} className="flex items-center gap-2 font-semibold">
        <ShieldEyeIcon className="size-5 text-paper-700" />
        Cautions
      </h2>
      <ul className={`mt-2 list-disc space-y-1 pl-5 leading-relaxed ${compact ? 'text-sm' : ''}`}>
        {sessionCautionLines(protocol, eyeWord).map((line) => (
          <li key={line}>{line}</li>
        ))}
      </ul>
      <details className="mt-2 text-sm" open={!compact}>
        <summary className="cursor-pointer font-medium text-iris-800">
          This protocol version’s own cautions ({protocol.cautions.length})
        </summary>
        <ul className="mt-2 list-disc space-y-1 pl-5 leading-relaxed">
          {protocol.cautions.map((caution) => (
            <li key={caution}>{caution}</li>
          ))}
        </ul>
      </details>
    </aside>
  );
}
