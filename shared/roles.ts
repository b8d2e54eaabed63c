/** The five staff roles. One person may hold several. */
export const roles = ['clinician', 'nurse', 'pharmacist', 'auditor', 'admin'] as const;
export type Role = (typeof roles)[number];

/**
 * What a signed-in person may do. The server's role table (server/auth/permissions.ts) is the
 * only place that maps roles to capabilities; the client reads a person's capabilities from
 * `GET /api/auth/me` and never decides access on its own.
 */
export const capabilities = [
  'today.view',
  'people.manage',
  'protocols.read',
  'protocols.import',
  'protocols.approve',
  'protocols.retire',
  'calculations.run',
  'audit.read',
  'audit.review',
  'audit.verify',
  'patients.read',
  'patients.manage',
  'orders.read',
  'orders.write',
  'orders.cancel',
  /** The list of orders that may still be cancelled, with only what identifies each. */
  'orders.list-cancellable',
  'dose-checks.perform',
  'preparations.record',
  'outbox.read',
  'sessions.run',
  'devices.read',
  'devices.check',
  'devices.manage',
  'follow-up.record',
  'outcomes.read',
  'lists.read',
  'lists.manage',
  'stock.read',
  'stock.manage',
  'stock.recall',
] as const;
export type Capability = (typeof capabilities)[number];

export const roleLabels: Record<Role, string> = {
  clinician: 'Clinician',
  nurse: 'Nurse',
  pharmacist: 'Pharmacist',
  auditor: 'Auditor',
  admin: 'Administrator',
};
