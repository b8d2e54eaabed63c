import { formatUnitTime } from '../../shared/format/figures';
import { answeredCautions } from '../../shared/orders/readiness';
import { lightPrecautionEnd, precautionStartFor } from '../../shared/session/light-precaution';
import type { AuditRepository } from '../audit/repository';
import type { Clock } from '../clock';
import type { UnitOfWork } from '../db/unit-of-work';
import { AppError } from '../http/app-error';
import { enqueueMessage } from '../mail/outbox-repository';
import type { OrderRepository } from '../orders/repository';
import type { Actor } from '../orders/service';
import type { SessionRepository } from './repository';

export function createDischargeService(deps: {
  unitOfWork: UnitOfWork;
  clock: Clock;
  orders: OrderRepository;
  sessions: SessionRepository;
  audit: AuditRepository;
  unitName: string;
  unitPhone: string;
  unitTimeZone: string;
}) {
  const { orders, sessions } = deps;

  async function sheet(orderId: number) {
    const order = await orders.findById(orderId);
    if (!order) throw AppError.notFound(`There is no order ${orderId}.`);
    const stored = await sessions.recordFor(orderId);
    if (!stored || stored.record.outcome === 'not-started')
      throw AppError.conflict('no_session', `Order ${orderId} has no session to discharge from.`);
    const record = stored.record;
    const definition = order.protocolVersion.definition;
    const zone = deps.unitTimeZone;
    // Written as the printed sheet and the e-mail write it ("…, 14:05 WET"), no longer "(WET)".
    const local = (iso: string | null | undefined) =>
      iso ? formatUnitTime(iso, zone, 'sheet') : null;
    // A PDT sheet always carries the precaution: from the infusion start, or with no start on
    // record from the latest plausible time, with a note saying so.
    const start =
      definition.drug && record.kind === 'pdt'
        ? precautionStartFor(record, deps.clock.now().toISOString())
        : null;
    const precaution =
      definition.drug && start
        ? {
            ...lightPrecautionEnd({
              infusionStartAt: start.at,
              hours: definition.drug.lightPrecautionH,
              zone,
            }),
            hours: definition.drug.lightPrecautionH,
            source: definition.drug.lightPrecautionSource,
            countedFrom: start.at,
            basis: start.basis,
            note: start.note,
          }
        : null;
    return {
      unitName: deps.unitName,
      unitPhone: deps.unitPhone,
      unitTimeZone: zone,
      order: { id: order.id, revision: order.revision, eye: order.eye, status: order.status },
      patient: {
        recordNumber: order.patient.recordNumber,
        givenName: order.patient.givenName,
        familyName: order.patient.familyName,
        dateOfBirth: order.patient.dateOfBirth,
        emailConsent: order.patient.emailConsent,
        hasEmail: !!order.patient.email,
      },
      protocol: {
        key: order.protocolVersion.key,
        version: order.protocolVersion.version,
        title: order.protocolVersion.title,
        kind: order.protocolVersion.kind,
      },
      plan: order.plan,
      record,
      startedLocal: local(record.sessionStartedAt),
      endedLocal: local(record.endedAt),
      precaution,
      cautions: definition.cautions,
      answeredCautions: answeredCautions(definition, order.checklist),
    };
  }

  return {
    sheet,

    /** Sends the discharge advice to the patient through the outbox, only if they agreed to e-mail. */
    async email(actor: Actor, orderId: number) {
      const data = await sheet(orderId);
      const order = await orders.findById(orderId);
      if (!order?.patient.email || !order.patient.emailConsent) {
        throw AppError.conflict(
          'no_email_consent',
          'The patient has not agreed to e-mail (or has no address); give the printed sheet instead.',
        );
      }
      const lines = [
        `Dear ${data.patient.givenName} ${data.patient.familyName},`,
        '',
        `Today at ${data.unitName} your ${data.order.eye} eye was treated (${data.protocol.title}).`,
      ];
      if (data.protocol.kind === 'pdt') {
        // Never without its light-precaution paragraph: a PDT sheet always has one (see sheet()).
        if (!data.precaution)
          throw AppError.conflict(
            'no_light_precaution',
            'The light-precaution end cannot be worked out for this session, so the advice is not sent; give the printed sheet and ask the clinician.',
          );
        lines.push(
          '',
          `Please protect your skin and eyes from direct sunlight and bright indoor light until ${data.precaution.endLocalText}.`,
          'Wear the protective clothing and dark glasses you were given. Normal indoor light is good for you: do not sit in the dark.',
        );
        if (data.precaution.note) lines.push(`(${data.precaution.note})`);
      }
      lines.push(
        '',
        `If your eye becomes painful, your vision gets worse, or you have any concern, call the eye unit on ${data.unitPhone}.`,
        '',
        `${data.unitName}`,
      );
      await deps.unitOfWork((tx) =>
        enqueueMessage(tx, {
          kind: 'discharge-advice',
          recipients: [order.patient.email!],
          subject: `Your treatment at ${data.unitName}: advice for the coming days`,
          body: lines.join('\n'),
          related: { type: 'order', id: orderId },
        }),
      );
      await deps.audit.append({
        actorUserId: actor.id,
        action: 'discharge.emailed',
        entityType: 'order',
        entityId: orderId,
        ipAddress: actor.ipAddress,
      });
      return { queued: true };
    },
  };
}

export type DischargeService = ReturnType<typeof createDischargeService>;
