import type { FieldProblem } from '../engine/plan-input-error';
import type { ProtocolVersion as ProtocolDefinition } from '../protocol/protocol-schema';
import type { DosePlan } from '../schemas/calculation';
import type { ChecklistAnswer } from '../schemas/orders';
import { weightChangeMessage, type WeightChange } from './weight-change';

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
}

/**
 * What stands between a draft and a signature, as field problems: unanswered contraindication
 * questions, a "yes" without an override reason, a soft-limit warning without a reason, a
 * retreatment inside the protocol's minimum interval without a reason. Pure, so the client can
 * show the same list before the clinician tries to sign.
 */
export function signatureProblems(input: ReadinessInput): FieldProblem[] {
  const problems: FieldProblem[] = [];
  const answers = new Map(input.checklist.map((a) => [a.id, a]));
  const known = new Set(input.definition.contraindications.map((c) => c.id));
  for (const answer of input.checklist) {
    if (!known.has(answer.id)) problems.push({ path: `checklist.${answer.id}`, message: `checklist question ${answer.id} is not part of this protocol version` });
  }
  for (const question of input.definition.contraindications) {
    const answer = answers.get(question.id);
    if (!answer) {
      problems.push({ path: `checklist.${question.id}`, message: `answer "${question.question}" (yes or no)` });
    } else if (answer.answer === 'yes' && !answer.overrideReason) {
      const kind = question.severity === 'absolute' ? 'a contraindication' : 'a caution';
      problems.push({ path: `checklist.${question.id}.overrideReason`, message: `"${question.question}" is answered yes (${kind}): treatment needs an override reason of 5 to 500 characters` });
    }
  }
  for (const warning of input.plan.warnings) {
    if (warning.code === 'soft-limit' && warning.field && !input.softLimitReasons[warning.field]) {
      problems.push({ path: `softLimitReasons.${warning.field}`, message: `${warning.message} — give a reason (5 to 500 characters) to go on` });
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
  return problems;
}

/** True when the figure lies within pct percent of the plan's figure. */
export function withinPct(entered: number, planned: number, pct: number): boolean {
  return Math.abs(entered - planned) <= (Math.abs(planned) * pct) / 100 + 1e-9;
}
