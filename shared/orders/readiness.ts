import type { FieldProblem } from '../engine/plan-input-error';
import type { ProtocolVersion as ProtocolDefinition } from '../protocol/protocol-schema';
import type { DosePlan } from '../schemas/calculation';
import type { ChecklistAnswer, OpenOrderFact } from '../schemas/orders';
import { weightChangeMessage, type WeightChange } from './weight-change';
import { formatNumber } from '../engine/rounding';
import { reasonOfSubstanceProblem } from './reason-of-substance';

export interface ReadinessInput {
  definition: ProtocolDefinition;
  plan: DosePlan;
  checklist: ChecklistAnswer[];
  softLimitReasons: Record<string, string>;
  retreatmentReason: string | null;
  /** Days since this eye's last treatment of the same kind, when inside the protocol's interval. */
  recentTreatmentDays: number | null;
  /** The change from the patient's last recorded weight, when it is beyond the unit's rule. */
  weightChange: WeightChange | null;
  weightChangeReason: string | null;
  /** The clinician's explicit acknowledgement that a too-thin stroma must first be swollen (CXL). */
  swellingAcknowledged: boolean;
  /** The patient's other open orders for the same eye and kind of treatment. */
  openOrders: readonly OpenOrderFact[];
  duplicateOrderReason: string | null;
}

/**
 * A second open order for the same patient, eye and kind of treatment is more often a slip (the
 * same order entered twice, or the other eye meant) than a plan: it needs a reason of substance.
 * Null when there is no other open order or the reason given is one.
 */
export function duplicateOrderProblem(
  openOrders: readonly OpenOrderFact[],
  reason: string | null | undefined,
): FieldProblem | null {
  if (openOrders.length === 0) return null;
  const weak = reasonOfSubstanceProblem(reason, undefined, 'why a second order is right');
  if (!weak) return null;
  return {
    path: 'duplicateOrderReason',
    message: `${otherOpenOrdersSentence(openOrders)}. Cancel or amend that one, or ${weak}`,
  };
}

/** "the patient has another open order of the same kind for this eye: order 41 (…, signed)". */
export function otherOpenOrdersSentence(openOrders: readonly OpenOrderFact[]): string {
  const others = openOrders.map((o) => `order ${o.id} (${o.protocolTitle}, ${o.status})`);
  return others.length === 1
    ? `the patient has another open order of the same kind for this eye: ${others[0]}`
    : `the patient has ${others.length} other open orders of the same kind for this eye: ${others.join(', ')}`;
}

type Question = ProtocolDefinition['contraindications'][number];

/** The thickness facts of a CXL plan, read from its working; null for a plan without them. */
function thicknessFacts(plan: DosePlan): { measuredUm: number; minimumUm: number } | null {
  const line = plan.working.find((entry) => entry.name === 'thicknessMarginUm');
  const measuredUm = line?.inputs.stromalThicknessUm?.value;
  const minimumUm = line?.inputs.minStromalThicknessUm?.value;
  return measuredUm === undefined || minimumUm === undefined ? null : { measuredUm, minimumUm };
}

/**
 * What the plan's measurement says the answer to a measurement-tied question must be; null when it
 * cannot say. A contradicting answer is refused rather than overwritten: the clinician answered
 * a question and should see that it disagrees with what was measured (one of the two is wrong,
 * a typo in the thickness as likely as a wrong tick), and a silently changed answer would sign
 * something the clinician never said.
 */
export function measuredAnswer(question: Question, plan: DosePlan): 'yes' | 'no' | null {
  if (question.measurement === 'stromal-thickness-below-minimum' && plan.thicknessOk !== null)
    return plan.thicknessOk ? 'no' : 'yes';
  return null;
}

/** The cautions answered yes, with the clinician's reason: what the standing banner shows after signing. */
export function answeredCautions(
  definition: ProtocolDefinition,
  checklist: ChecklistAnswer[],
): { id: string; question: string; reason: string }[] {
  const answers = new Map(checklist.map((a) => [a.id, a]));
  return definition.contraindications.flatMap((question) => {
    const answer = answers.get(question.id);
    return question.severity === 'caution' && answer?.answer === 'yes'
      ? [{ id: question.id, question: question.question, reason: answer.overrideReason ?? '' }]
      : [];
  });
}

/**
 * What stands between a draft and a signature, as field problems: unanswered contraindication
 * questions; an answer the order's own measurement contradicts; a "yes" to an absolute
 * contraindication (nothing unlocks it); a "yes" to a caution without a reason of substance; a
 * stroma below the minimum on a protocol without a swelling step, or with one but not
 * acknowledged; a soft-limit warning without a reason; a retreatment inside the protocol's
 * minimum interval without a reason; a second open order of the same kind for the eye without a
 * reason of substance. Pure, so the client can show the same list before the
 * clinician tries to sign.
 */
export function signatureProblems(input: ReadinessInput): FieldProblem[] {
  const problems: FieldProblem[] = [];
  const answers = new Map(input.checklist.map((a) => [a.id, a]));
  const known = new Set(input.definition.contraindications.map((c) => c.id));
  for (const answer of input.checklist) {
    if (!known.has(answer.id))
      problems.push({
        path: `checklist.${answer.id}`,
        message: `checklist question ${answer.id} is not part of this protocol version`,
      });
  }
  for (const question of input.definition.contraindications) {
    const answer = answers.get(question.id);
    const measured = measuredAnswer(question, input.plan);
    const facts = thicknessFacts(input.plan);
    if (!answer) {
      problems.push({
        path: `checklist.${question.id}`,
        message: `answer "${question.question}" (yes or no)`,
      });
    } else if (measured !== null && answer.answer !== measured) {
      const said = facts
        ? `the stromal thickness entered (${formatNumber(facts.measuredUm)} µm) is ${measured === 'yes' ? 'below' : 'at or above'} the minimum of ${formatNumber(facts.minimumUm)} µm`
        : 'the measurement in this order says otherwise';
      problems.push({
        path: `checklist.${question.id}.answer`,
        message: `"${question.question}" is answered ${answer.answer}, but ${said}: correct the answer or the measurement`,
      });
    } else if (answer.answer === 'yes' && question.severity === 'absolute') {
      problems.push({
        path: `checklist.${question.id}.answer`,
        message: `"${question.question}" is answered yes: an absolute contraindication in this protocol version stops the order, and no reason unlocks it`,
      });
    } else if (answer.answer === 'yes') {
      const weak = reasonOfSubstanceProblem(answer.overrideReason, question.question);
      if (weak)
        problems.push({
          path: `checklist.${question.id}.overrideReason`,
          message: `"${question.question}" is answered yes (a caution): ${weak}`,
        });
    }
  }
  const facts = thicknessFacts(input.plan);
  const cxl = input.definition.cxl;
  if (cxl && input.plan.thicknessOk === false) {
    const thin = facts
      ? `the stroma (${formatNumber(facts.measuredUm)} µm) is below this protocol's minimum of ${formatNumber(facts.minimumUm)} µm`
      : "the stroma is below this protocol's minimum";
    if (!cxl.swellingAllowed) {
      problems.push({
        path: 'inputs.stromalThicknessUm',
        message: `${thin} and the protocol has no swelling step: do not treat with this protocol — the plan cannot be signed`,
      });
    } else if (!input.swellingAcknowledged) {
      problems.push({
        path: 'swellingAcknowledged',
        message: `${thin}: acknowledge that the swelling step must bring it to ${formatNumber(cxl.minStromalThicknessUm)} µm before UV`,
      });
    }
  }
  for (const warning of input.plan.warnings) {
    if (warning.code === 'soft-limit' && warning.field && !input.softLimitReasons[warning.field]) {
      problems.push({
        path: `softLimitReasons.${warning.field}`,
        message: `${warning.message} — give a reason (5 to 500 characters) to go on`,
      });
    }
  }
  if (input.recentTreatmentDays !== null && !input.retreatmentReason) {
    problems.push({
      path: 'retreatmentReason',
      message: `this eye had the same kind of treatment ${input.recentTreatmentDays} days ago, inside the protocol's minimum of ${input.definition.retreatmentMinDays} days — give a reason (5 to 500 characters)`,
    });
  }
  if (input.weightChange !== null && !input.weightChangeReason) {
    problems.push({ path: 'weightChangeReason', message: weightChangeMessage(input.weightChange) });
  }
  const duplicate = duplicateOrderProblem(input.openOrders, input.duplicateOrderReason);
  if (duplicate) problems.push(duplicate);
  return problems;
}
