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

/** Details in one line, "key: value; key: value", so a row stays readable; the full JSON is one click away. */
export function summariseDetails(details: unknown, limit = 140): string {
  if (details === null || details === undefined) return '';
  if (typeof details !== 'object') return String(details);
  const parts = Object.entries(details as Record<string, unknown>)
    .filter(([key]) => key !== 'idempotencyKey')
    .map(
      ([key, value]) =>
        `${key}: ${typeof value === 'object' && value !== null ? JSON.stringify(value) : String(value)}`,
    );
  const text = parts.join('; ');
  return text.length > limit ? `${text.slice(0, limit - 1)}…` : text;
}
