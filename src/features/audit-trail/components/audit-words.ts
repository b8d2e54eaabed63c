/** Actions of the audit trail as a person reads them; an action not listed shows by its name. */
const actionWords: Record<string, string> = {
  'sign-in': 'Signed in',
  'sign-in.failed': 'Sign-in refused',
  'sign-out': 'Signed out',
  'person.created': 'Person added',
  'person.updated': 'Person changed',
  'person.deactivated': 'Person deactivated',
  'person.reactivated': 'Person reactivated',
  'patient.created': 'Patient added',
  'patient.viewed': 'Patient record opened',
  'order.viewed': 'Order opened',
  'order.fhir-read': 'Treatment record read as FHIR',
  'patient.fhir-refreshed': 'Patient read again from the hospital record',
  'attachment.viewed': 'Report opened (downloaded)',
  'export.downloaded': 'Export downloaded (CSV)',
  'order.drafted': 'Order drafted',
  'order.draft-edited': 'Order draft changed',
  'order.signed': 'Order signed',
  'order.signature-refused': 'Order signature refused',
  'order.amended': 'Order amended',
  'order.prepared': 'Drug preparation recorded',
  'order.re-prepared': 'Drug made up again after its beyond-use time',
  'attachment.added': 'Report attached',
  'dose-check.matched': 'Dose check agreed',
  'dose-check.refused': 'Dose check disagreed',
  'dose-check.refused-and-returned': 'Dose check disagreed; order sent back',
  'session.session-started': 'Session started',
  'session.session-completed': 'Session completed',
  'session.session-stopped': 'Session stopped',
  'session.extravasation': 'Extravasation recorded',
  'session.thickness-override': 'Thickness minimum overridden',
  'session.tap-withdrawn': 'Mistaken tap withdrawn',
  'session.tap-refused': 'Tap refused by a session rule',
  'session.thickness-override-authorised': 'UV below the thickness minimum authorised',
  'session.exposure-recorded': 'Laser exposure entered',
  'deviation.closed': 'Deviation closed',
  'deviation.reopened': 'Deviation reopened',
  'discharge.emailed': 'Discharge advice e-mailed',
  'protocol.loaded': 'Protocol version loaded',
  'protocol.imported': 'Protocol version imported',
  'protocol.draft-created': 'Protocol draft created',
  'protocol.draft-edited': 'Protocol draft changed',
  'protocol.approval-given': 'Protocol approval given',
  'protocol.approved': 'Protocol version approved',
  'protocol.retired': 'Protocol version retired',
  'demo.scenario-loaded': 'Demo history loaded',
};

export function actionLabel(action: string): string {
  return actionWords[action] ?? action;
}

export const knownActions = Object.keys(actionWords);

export const recordTypes: Record<string, string> = {
  order: 'Order',
  deviation: 'Deviation',
  patient: 'Patient',
  protocol_version: 'Protocol version',
  user: 'Person',
  export: 'Export',
};

export function recordTypeLabel(type: string | null): string {
  return type === null ? '—' : (recordTypes[type] ?? type);
}

/** Words for detail keys that a plain split of the name would read badly. */
const detailWords: Record<string, string> = {
  bsaM2: 'BSA (m²)',
  bsaFormula: 'BSA formula',
  lesionGldUm: 'Lesion GLD (µm)',
  sha256: 'Fingerprint (SHA-256)',
  previousSha256: 'Earlier fingerprint (SHA-256)',
  ipAddress: 'IP address',
  recordNumber: 'Record number',
  idempotencyKey: 'Tap key',
  withdrawnKey: 'Withdrawn tap key',
  otherSessionsEnded: 'Other sign-ins ended',
  sessionsEnded: 'Sign-ins ended',
  email: 'E-mail',
  export: 'Export file',
  approvedAs: 'Approved as',
  by: 'By',
};

/** Unit endings of field names (shared/STYLE.md: units in numeric names) and how they are written. */
const unitEndings: [RegExp, string][] = [
  [/MwPerCm2$/, 'mW/cm²'],
  [/JPerCm2$/, 'J/cm²'],
  [/MgPerM2$/, 'mg/m²'],
  [/MlPerMin$/, 'mL/min'],
  [/MgPerMl$/, 'mg/mL'],
  [/Cm2$/, 'cm²'],
  [/M2$/, 'm²'],
  [/Mg$/, 'mg'],
  [/Ml$/, 'mL'],
  [/Mw$/, 'mW'],
  [/Um$/, 'µm'],
  [/Kg$/, 'kg'],
  [/Cm$/, 'cm'],
  [/Pct$/, '%'],
  [/Min$/, 'min'],
  [/Bytes$/, 'bytes'],
  [/([a-z])S$/, 's'],
  [/([a-z])H$/, 'h'],
  [/([a-z])J$/, 'J'],
];

/** A detail's key as a label: "drugVolumeMl" → "Drug volume (mL)", "patientId" → "Patient id". */
export function detailLabel(key: string): string {
  const known = detailWords[key];
  if (known) return known;
  let name = key;
  let unit = '';
  for (const [ending, written] of unitEndings) {
    if (ending.test(name) && name.replace(ending, '$1').length > 0) {
      name = name.replace(ending, '$1');
      unit = written;
      break;
    }
  }
  const words = name
    .replace(/([a-z0-9])([A-Z])/g, '$1 $2')
    .replace(/[_-]+/g, ' ')
    .toLowerCase()
    .replace(/\bid\b/g, 'id')
    .replace(/\bbsa\b/g, 'BSA')
    .replace(/\bgld\b/g, 'GLD')
    .replace(/\buv\b/g, 'UV');
  const label = words.charAt(0).toUpperCase() + words.slice(1);
  return unit ? `${label} (${unit})` : label;
}

/** A detail value in words: yes/no, lists joined, a time on the unit's clock, nothing as "—". */
export function detailValue(value: unknown, formatTime: (iso: string) => string): string {
  if (value === null || value === undefined || value === '') return '—';
  if (typeof value === 'boolean') return value ? 'Yes' : 'No';
  if (typeof value === 'number') return String(Number(value.toPrecision(12)));
  if (typeof value === 'string')
    return /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}/.test(value) ? formatTime(value) : value;
  if (Array.isArray(value))
    return value.length === 0
      ? 'none'
      : value.map((item) => detailValue(item, formatTime)).join(', ');
  return Object.entries(value as Record<string, unknown>)
    .map(([key, inner]) => `${detailLabel(key)}: ${detailValue(inner, formatTime)}`)
    .join('; ');
}

/** A detail list: labelled values, nested objects as their own lists. */
export type DetailEntry = { label: string; value: string; entries?: DetailEntry[] };

export function detailEntries(
  details: unknown,
  formatTime: (iso: string) => string,
): DetailEntry[] {
  if (details === null || details === undefined) return [];
  if (typeof details !== 'object' || Array.isArray(details))
    return [{ label: 'Detail', value: detailValue(details, formatTime) }];
  return Object.entries(details as Record<string, unknown>).map(([key, value]) =>
    value !== null && typeof value === 'object' && !Array.isArray(value)
      ? {
          label: detailLabel(key),
          value: '',
          entries: detailEntries(value, formatTime),
        }
      : { label: detailLabel(key), value: detailValue(value, formatTime) },
  );
}

/** Details in one line, "Label: value; Label: value", so a row stays readable; the full list is one click away. */
export function summariseDetails(
  details: unknown,
  formatTime: (iso: string) => string = (iso) => iso,
  limit = 140,
): string {
  if (details === null || details === undefined) return '';
  if (typeof details !== 'object') return String(details);
  const parts = Object.entries(details as Record<string, unknown>)
    .filter(([key]) => key !== 'idempotencyKey')
    .map(([key, value]) => `${detailLabel(key)}: ${detailValue(value, formatTime)}`);
  const text = parts.join('; ');
  return text.length > limit ? `${text.slice(0, limit - 1)}…` : text;
}
