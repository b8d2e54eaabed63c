import { capabilities, type Capability, type Role } from '../../shared/roles';

/**
 * The role table: the only place that says which role may do what. Routes name a capability;
 * a person's capabilities are the union over their roles.
 */
export const roleCapabilities: Record<Role, readonly Capability[]> = {
  clinician: [
    'today.view',
    'protocols.read',
    'protocols.approve',
    'calculations.run',
    'patients.read',
    'patients.manage',
    'orders.read',
    'orders.write',
  ],
  pharmacist: [
    'today.view',
    'protocols.read',
    'protocols.approve',
    'calculations.run',
    'patients.read',
    'orders.read',
    'dose-checks.perform',
    'preparations.record',
  ],
  nurse: [
    'today.view',
    'protocols.read',
    'calculations.run',
    'patients.read',
    'orders.read',
    'sessions.run',
  ],
  auditor: [
    'today.view',
    'protocols.read',
    'calculations.run',
    'audit.read',
    'audit.review',
    'audit.verify',
    'patients.read',
    'orders.read',
  ],
  admin: [
    'today.view',
    'people.manage',
    'protocols.read',
    'protocols.import',
    'protocols.retire',
    'calculations.run',
    'patients.manage',
    'patients.read',
    'outbox.read',
    'audit.verify',
  ],
};

export function capabilitiesOf(roles: readonly Role[]): Capability[] {
  const held = new Set(roles.flatMap((role) => roleCapabilities[role]));
  // Keep the declared order so the client shows navigation in a stable order.
  return capabilities.filter((c) => held.has(c));
}
