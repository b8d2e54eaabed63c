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
    'orders.cancel',
    'devices.read',
    'follow-up.record',
    'outcomes.read',
    'lists.read',
    'lists.manage',
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
    'devices.read',
    'lists.read',
    'stock.read',
    'stock.manage',
    'stock.recall',
  ],
  nurse: [
    'today.view',
    'protocols.read',
    'calculations.run',
    'patients.read',
    'orders.read',
    'sessions.run',
    'devices.read',
    // The nurse checks the device's output before a session (step clock pre-checks).
    'devices.check',
    'lists.read',
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
    'devices.read',
    'outcomes.read',
    'lists.read',
    'stock.read',
    'stock.recall',
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
    'orders.cancel',
    // Not orders.read: the cancelling screen lists open orders by identity, never their figures.
    'orders.list-cancellable',
    'outbox.read',
    'audit.verify',
    // The device lead's duty sits with the administrator: the register, lenses and checks.
    'devices.read',
    'devices.check',
    'devices.manage',
    'lists.read',
    'lists.manage',
  ],
};

/**
 * Who may cancel a given order (the route asks for `orders.cancel` first): an administrator any
 * order; anyone else only an order they signed, or, before it is signed, one they drafted.
 */
export function mayCancelOrder(
  actor: { id: number; roles: readonly Role[] },
  order: { signedById: number | null; createdById: number },
): boolean {
  if (actor.roles.includes('admin')) return true;
  return order.signedById === null ? order.createdById === actor.id : order.signedById === actor.id;
}

/** Whether these roles may read an order's clinical page (its inputs, plan and answers). */
export function mayReadOrders(roles: readonly Role[]): boolean {
  return roles.some((role) => roleCapabilities[role].includes('orders.read'));
}

export function capabilitiesOf(roles: readonly Role[]): Capability[] {
  const held = new Set(roles.flatMap((role) => roleCapabilities[role]));
  // Keep the declared order so the client shows navigation in a stable order.
  return capabilities.filter((c) => held.has(c));
}
