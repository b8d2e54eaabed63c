/**
 * What each field of the API is called where a person reads it: the one table both the server's
 * refusals and the screens' messages use. Shared schemas word their messages with the field's
 * key ("bsaM2 must be …", "height.value must be …") so the API stays exact; before a message
 * reaches a person its key is swapped for the label here.
 */
export const fieldLabels: Readonly<Record<string, string>> = {
  // Orders
  patientId: 'Patient',
  eye: 'Eye',
  protocol: 'Protocol',
  'protocol.key': 'Protocol',
  'protocol.version': 'Protocol version',
  'height.value': 'Height',
  'height.unit': 'Height unit',
  'weight.value': 'Weight',
  'weight.unit': 'Weight unit',
  height: 'Height',
  weight: 'Weight',
  bsaFormula: 'BSA formula',
  lesionGldUm: 'Lesion GLD',
  lensMagnification: 'Lens magnification',
  stromalThicknessUm: 'Stromal thickness',
  'checklist[].id': 'The checklist question',
  'checklist[].answer': 'The answer',
  'checklist[].overrideReason': 'The reason',
  'softLimitReasons[field]': 'The reason',
  retreatmentReason: 'The retreatment reason',
  weightChangeReason: 'The reason for the change in weight',
  duplicateOrderReason: 'The reason for a second open order',
  supersededVersionReason: 'The reason for the superseded version',
  note: 'The note',
  amendmentReason: 'The amendment reason',
  swellingAcknowledged: 'The swelling acknowledgement',
  version: 'Version',
  password: 'Password',
  meaning: 'The meaning of the signature',
  reason: 'The reason',
  // Patients
  recordNumber: 'Record number',
  givenName: 'Given name',
  familyName: 'Family name',
  dateOfBirth: 'Date of birth',
  email: 'E-mail',
  emailConsent: 'Agreement to e-mail',
  duplicateConfirmed: 'The confirmation',
  duplicateReason: 'The reason',
  // Dose check and preparation
  bsaM2: 'BSA',
  doseMg: 'Dose',
  drugVolumeMl: 'Drug volume',
  comment: 'The comment',
  vialLot: 'Vial lot',
  vialExpiry: 'Vial expiry',
  reconstitutedAt: 'Reconstitution time',
  volumeDrawnMl: 'Volume drawn',
};

/** Keys longest first, so "height.value" is swapped before "height". */
const keysLongestFirst = Object.keys(fieldLabels).sort((a, b) => b.length - a.length);

/** The label of a field key or API path (`inputs.height.value` → "Height"); the key itself if unknown. */
export function fieldLabel(pathOrKey: string): string {
  const plain = pathOrKey.replace(/^inputs\./, '');
  return fieldLabels[plain] ?? fieldLabels[plain.split('.')[0] ?? ''] ?? pathOrKey;
}

/** The label inside a sentence: "the drug volume", "BSA". */
export function fieldWord(pathOrKey: string): string {
  const label = fieldLabel(pathOrKey);
  return /^[A-Z]{2}/.test(label) ? label : label.charAt(0).toLowerCase() + label.slice(1);
}

/**
 * A message that starts with a field's key, with the key swapped for its label and the first
 * letter made a capital: "height.value must be a number" → "Height must be a number". `extra`
 * adds a screen's own words for keys of its own.
 */
export function speakFieldMessage(
  message: string,
  extra: Readonly<Record<string, string>> = {},
): string {
  const keys = [...Object.keys(extra), ...keysLongestFirst];
  for (const key of keys) {
    if (message === key || message.startsWith(`${key} `)) {
      const label = extra[key] ?? fieldLabels[key]!;
      return `${label}${message.slice(key.length)}`;
    }
  }
  return message.charAt(0).toUpperCase() + message.slice(1);
}

/** Problems joined into one sentence each, in the order given, with no doubled full stops. */
export function joinProblemMessages(messages: readonly string[]): string {
  return messages
    .map((m) => m.trim().replace(/[.;]+$/, ''))
    .filter((m) => m !== '')
    .join('; ');
}
