import type { FieldError, FieldErrors, Resolver } from 'react-hook-form';
import type { z } from 'zod';
import { bsaFormulaNames, type BsaFormulaName } from '../../../../shared/engine/bsa';
import { duplicateOrderProblem } from '../../../../shared/orders/readiness';
import type { ProtocolVersion } from '../../../../shared/protocol/protocol-schema';
import { signatureProblems } from '../../../../shared/orders/readiness';
import type { WeightChange } from '../../../../shared/orders/weight-change';
import type { DosePlan, PlanInputs } from '../../../../shared/schemas/calculation';
import {
  amendOrderSchema,
  orderDraftSchema,
  type AmendOrder,
  type OpenOrderFact,
  type OrderDetail,
  type OrderDraft,
} from '../../../../shared/schemas/orders';
import type { Eye } from '../../../../shared/schemas/patients';
import { supersededVersionProblem } from '../../../../shared/orders/superseded-version';
import { parseTypedNumber } from '../../../lib/typed-number';

const sentence = (message: string) => message.charAt(0).toUpperCase() + message.slice(1);

/**
 * What the order form holds: text as typed (so nothing is lost or reformatted on an error), the
 * checklist keyed by question id, and soft-limit reasons keyed by the warned field.
 */
export type OrderFormValues = {
  patientId: string;
  eye: Eye | '';
  protocolRef: string;
  heightValue: string;
  heightUnit: 'cm' | 'in';
  weightValue: string;
  weightUnit: 'kg' | 'lb';
  bsaFormula: BsaFormulaName | '';
  lesionGldUm: string;
  lensMagnification: string;
  /** The lens picked from the register (its id), or '' when the factor is typed. */
  lensId: string;
  stromalThicknessUm: string;
  checklist: Record<string, { answer: '' | 'yes' | 'no'; overrideReason: string }>;
  softLimitReasons: Record<string, string>;
  retreatmentReason: string;
  weightChangeReason: string;
  /** Why a second open order for the same eye and kind is right. */
  duplicateOrderReason: string;
  note: string;
  amendmentReason: string;
  /** Why this order uses a version that a newer approved version supersedes. */
  supersededVersionReason: string;
  /** CXL with a swelling step and a stroma below the minimum: the clinician's acknowledgement. */
  swellingAcknowledged: boolean;
};

export type OrderFormMode = 'new' | 'edit' | 'amend';

export type OrderFormContext = {
  mode: OrderFormMode;
  definition: ProtocolVersion | null;
  /** Fields the preview or the server warned about; only their reasons are sent. */
  warnedFields: readonly string[] | null;
  /** The newer approved version that supersedes the chosen one, if any. */
  supersededBy?: number | null;
  /** The patient's other open orders for this eye and kind, as the server reported them. */
  openOrders?: readonly OpenOrderFact[];
};

/** Soft-limit reasons are keyed by API paths with dots, which a form path would read as nesting. */
export const reasonKey = (field: string) => field.replaceAll('.', '__');
export const reasonField = (key: string) => key.replaceAll('__', '.');

export const protocolRefOf = (key: string, version: number) => `${key}@${version}`;
export function parseProtocolRef(ref: string): { key: string; version: number } | null {
  const match = /^([a-z0-9-]+)@(\d+)$/.exec(ref);
  return match ? { key: match[1]!, version: Number(match[2]) } : null;
}

export function emptyOrderForm(patientId?: number): OrderFormValues {
  return {
    patientId: patientId ? String(patientId) : '',
    eye: '',
    protocolRef: '',
    heightValue: '',
    heightUnit: 'cm',
    weightValue: '',
    weightUnit: 'kg',
    bsaFormula: '',
    lesionGldUm: '',
    lensMagnification: '',
    lensId: '',
    stromalThicknessUm: '',
    checklist: {},
    softLimitReasons: {},
    retreatmentReason: '',
    weightChangeReason: '',
    duplicateOrderReason: '',
    note: '',
    amendmentReason: '',
    supersededVersionReason: '',
    swellingAcknowledged: false,
  };
}

const text = (value: number | undefined) => (value === undefined ? '' : String(value));

const asText = (value: unknown): string => (typeof value === 'string' ? value : '');
const oneOf = <T extends string, F extends string>(
  value: unknown,
  allowed: readonly T[],
  fallback: F,
): T | F => (allowed.includes(value as T) ? (value as T) : fallback);

/**
 * The form's values as react-hook-form reports them, made whole. A field that has not been
 * registered yet reads as undefined: the reason box under a checklist "yes" appears only after
 * the click, and a soft-limit reason only after the warning, so their first reading has no text.
 * A restored browser draft may be older than the form. Everything that reads the form reads it
 * through here.
 */
export function settleFormValues(raw: unknown): OrderFormValues {
  const v = (raw && typeof raw === 'object' ? raw : {}) as Partial<
    Record<keyof OrderFormValues, unknown>
  >;
  const checklistIn =
    v.checklist && typeof v.checklist === 'object' ? (v.checklist as Record<string, unknown>) : {};
  const checklist: OrderFormValues['checklist'] = {};
  for (const [id, entry] of Object.entries(checklistIn)) {
    const e = (entry && typeof entry === 'object' ? entry : {}) as {
      answer?: unknown;
      overrideReason?: unknown;
    };
    checklist[id] = {
      answer: oneOf(e.answer, ['yes', 'no'] as const, ''),
      overrideReason: asText(e.overrideReason),
    };
  }
  const reasonsIn =
    v.softLimitReasons && typeof v.softLimitReasons === 'object'
      ? (v.softLimitReasons as Record<string, unknown>)
      : {};
  return {
    patientId: asText(v.patientId),
    eye: oneOf(v.eye, ['right', 'left'] as const, ''),
    protocolRef: asText(v.protocolRef),
    heightValue: asText(v.heightValue),
    heightUnit: oneOf(v.heightUnit, ['cm', 'in'] as const, 'cm'),
    weightValue: asText(v.weightValue),
    weightUnit: oneOf(v.weightUnit, ['kg', 'lb'] as const, 'kg'),
    bsaFormula: oneOf(v.bsaFormula, bsaFormulaNames, ''),
    lesionGldUm: asText(v.lesionGldUm),
    lensMagnification: asText(v.lensMagnification),
    lensId: asText(v.lensId),
    stromalThicknessUm: asText(v.stromalThicknessUm),
    checklist,
    softLimitReasons: Object.fromEntries(
      Object.entries(reasonsIn).map(([key, reason]) => [key, asText(reason)]),
    ),
    retreatmentReason: asText(v.retreatmentReason),
    weightChangeReason: asText(v.weightChangeReason),
    duplicateOrderReason: asText(v.duplicateOrderReason),
    note: asText(v.note),
    amendmentReason: asText(v.amendmentReason),
    supersededVersionReason: asText(v.supersededVersionReason),
    swellingAcknowledged: v.swellingAcknowledged === true,
  };
}

/** A saved order back into the form, for editing a draft or amending a signed order. */
export function orderToForm(order: OrderDetail): OrderFormValues {
  const { inputs } = order;
  const heightUnit = inputs.height?.unit === 'in' ? 'in' : 'cm';
  // Metres are not offered on the form; a height stored in metres is shown in centimetres.
  const heightValue = inputs.height
    ? inputs.height.unit === 'm'
      ? String(Number((inputs.height.value * 100).toPrecision(12)))
      : String(inputs.height.value)
    : '';
  return {
    patientId: String(order.patient.id),
    eye: order.eye,
    protocolRef: protocolRefOf(order.protocol.key, order.protocol.version),
    heightValue,
    heightUnit,
    weightValue: text(inputs.weight?.value),
    weightUnit: inputs.weight?.unit ?? 'kg',
    bsaFormula: inputs.bsaFormula ?? '',
    lesionGldUm: text(inputs.lesionGldUm),
    lensMagnification: text(inputs.lensMagnification),
    lensId: text(inputs.lensId),
    stromalThicknessUm: text(inputs.stromalThicknessUm),
    checklist: Object.fromEntries(
      order.checklist.map((a) => [
        a.id,
        { answer: a.answer, overrideReason: a.overrideReason ?? '' },
      ]),
    ),
    softLimitReasons: Object.fromEntries(
      Object.entries(order.softLimitReasons).map(([field, reason]) => [reasonKey(field), reason]),
    ),
    retreatmentReason: order.retreatmentReason ?? '',
    weightChangeReason: order.weightChangeReason ?? '',
    duplicateOrderReason: order.duplicateOrderReason ?? '',
    note: order.note ?? '',
    amendmentReason: '',
    supersededVersionReason: order.supersededVersionReason ?? '',
    swellingAcknowledged: order.swellingAcknowledged,
  };
}

/** A typed measurement: blank is "not given"; a decimal comma is accepted; anything else is refused. */
export const parseMeasure = parseTypedNumber;

const numberFields = {
  heightValue: 'Height',
  weightValue: 'Weight',
  lesionGldUm: 'Lesion GLD',
  lensMagnification: 'Lens magnification',
  stromalThicknessUm: 'Stromal thickness',
} as const;
type NumberField = keyof typeof numberFields;

/** The measurements the chosen protocol kind takes; the other kind's boxes are left out, not sent. */
export function formToInputs(
  raw: OrderFormValues,
  kind: ProtocolVersion['kind'] | null,
): { inputs: PlanInputs; invalid: NumberField[] } {
  const values = settleFormValues(raw);
  const invalid: NumberField[] = [];
  const read = (field: NumberField) => {
    const parsed = parseMeasure(values[field]);
    if (parsed === 'invalid') {
      invalid.push(field);
      return undefined;
    }
    return parsed;
  };
  const inputs: PlanInputs = {};
  const height = read('heightValue');
  const weight = read('weightValue');
  if (height !== undefined) inputs.height = { value: height, unit: values.heightUnit };
  if (weight !== undefined) inputs.weight = { value: weight, unit: values.weightUnit };
  if (values.bsaFormula && (kind === 'pdt' || height !== undefined || weight !== undefined))
    inputs.bsaFormula = values.bsaFormula;
  if (kind === 'pdt') {
    const gld = read('lesionGldUm');
    const magnification = read('lensMagnification');
    if (gld !== undefined) inputs.lesionGldUm = gld;
    if (magnification !== undefined) inputs.lensMagnification = magnification;
    if (/^[1-9]\d*$/.test(values.lensId)) inputs.lensId = Number(values.lensId);
  }
  if (kind === 'cxl') {
    const thickness = read('stromalThicknessUm');
    if (thickness !== undefined) inputs.stromalThicknessUm = thickness;
  }
  return { inputs, invalid };
}

const blankToNull = (value: string) => (value.trim() === '' ? null : value.trim());

/** The draft the API takes, built from the form (not yet checked). */
export function formToDraft(
  raw: OrderFormValues,
  context: OrderFormContext,
): OrderDraft | AmendOrder {
  const values = settleFormValues(raw);
  const protocol = parseProtocolRef(values.protocolRef);
  const { inputs } = formToInputs(values, context.definition?.kind ?? null);
  const questionIds = context.definition
    ? context.definition.contraindications.map((c) => c.id)
    : Object.keys(values.checklist);
  const checklist = questionIds.flatMap((id) => {
    const entry = values.checklist[id];
    // An unanswered radio pair reads as null or ''; either way the question stays open.
    if (!entry || (entry.answer !== 'yes' && entry.answer !== 'no')) return [];
    const severity = context.definition?.contraindications.find((c) => c.id === id)?.severity;
    const overrideReason =
      entry.answer === 'yes' && severity !== 'absolute' ? blankToNull(entry.overrideReason) : null;
    return [{ id, answer: entry.answer, ...(overrideReason ? { overrideReason } : {}) }];
  });
  const softLimitReasons = Object.fromEntries(
    Object.entries(values.softLimitReasons)
      .map(([key, reason]) => [reasonField(key), reason.trim()] as const)
      .filter(
        ([field, reason]) =>
          reason !== '' && (context.warnedFields === null || context.warnedFields.includes(field)),
      ),
  );
  const draft: OrderDraft = {
    patientId: /^\d+$/.test(values.patientId) ? Number(values.patientId) : Number.NaN,
    eye: values.eye as Eye,
    protocol: protocol ?? { key: '' },
    inputs,
    checklist,
    softLimitReasons,
    retreatmentReason: blankToNull(values.retreatmentReason),
    weightChangeReason: blankToNull(values.weightChangeReason),
    supersededVersionReason: blankToNull(values.supersededVersionReason),
    duplicateOrderReason: blankToNull(values.duplicateOrderReason),
    note: blankToNull(values.note),
    swellingAcknowledged: context.definition?.kind === 'cxl' && values.swellingAcknowledged,
  };
  return context.mode === 'amend'
    ? { ...draft, amendmentReason: values.amendmentReason.trim() }
    : draft;
}

/** The form field that shows a problem reported for an API path (from zod, the engine or the server). */
export function formFieldFor(path: string, draft?: Pick<OrderDraft, 'checklist'>): string | null {
  const parts = path.split('.');
  const [head, second, third] = parts;
  switch (head) {
    case 'patientId':
    case 'eye':
    case 'retreatmentReason':
    case 'weightChangeReason':
    case 'duplicateOrderReason':
    case 'note':
    case 'amendmentReason':
    case 'supersededVersionReason':
    case 'swellingAcknowledged':
      return head;
    case 'protocol':
      return 'protocolRef';
    case 'inputs':
      if (second === 'height') return third === 'unit' ? 'heightUnit' : 'heightValue';
      if (second === 'weight') return third === 'unit' ? 'weightUnit' : 'weightValue';
      if (
        second === 'bsaFormula' ||
        second === 'lesionGldUm' ||
        second === 'lensMagnification' ||
        second === 'stromalThicknessUm'
      )
        return second;
      return null;
    case 'checklist': {
      if (second === undefined) return null;
      // zod names a checklist entry by its index; the server names it by the question id.
      const id = /^\d+$/.test(second) && draft ? draft.checklist[Number(second)]?.id : second;
      if (!id) return null;
      return third === 'overrideReason'
        ? `checklist.${id}.overrideReason`
        : `checklist.${id}.answer`;
    }
    case 'softLimitReasons':
      return parts.length > 1 ? `softLimitReasons.${reasonKey(parts.slice(1).join('.'))}` : null;
    default:
      return null;
  }
}

function setNested(errors: Record<string, unknown>, name: string, error: FieldError) {
  const parts = name.split('.');
  let node = errors;
  for (const part of parts.slice(0, -1)) {
    node[part] ??= {};
    node = node[part] as Record<string, unknown>;
  }
  const last = parts.at(-1)!;
  if (!node[last]) node[last] = error;
}

type Problem = { field: string; message: string };

/** Checks the form before it is sent: the shared draft schema plus what the form itself asks for. */
export function checkOrderForm(
  raw: OrderFormValues,
  context: OrderFormContext,
): { draft: OrderDraft | AmendOrder; problems: Problem[]; unplaced: string[] } {
  const values = settleFormValues(raw);
  const draft = formToDraft(values, context);
  const problems: Problem[] = [];
  const unplaced: string[] = [];

  if (!/^\d+$/.test(values.patientId))
    problems.push({ field: 'patientId', message: 'Choose the patient' });
  if (values.eye === '')
    problems.push({ field: 'eye', message: 'Choose the treatment eye: right or left' });
  const protocol = parseProtocolRef(values.protocolRef);
  if (!protocol) problems.push({ field: 'protocolRef', message: 'Choose a protocol version' });
  else if (!context.definition)
    problems.push({
      field: 'protocolRef',
      message: 'The protocol version is still loading; try again in a moment',
    });
  if (protocol && context.supersededBy) {
    const problem = supersededVersionProblem(
      { ...protocol, version: protocol.version ?? 0, supersededBy: context.supersededBy },
      values.supersededVersionReason,
    );
    if (problem) problems.push({ field: 'supersededVersionReason', message: sentence(problem) });
  }
  const { invalid } = formToInputs(values, context.definition?.kind ?? null);
  for (const field of invalid)
    problems.push({
      field,
      message: `${numberFields[field]} must be a number, e.g. ${field === 'lensMagnification' ? '1.05' : '180'}`,
    });
  for (const question of context.definition?.contraindications ?? []) {
    const entry = values.checklist[question.id];
    // An absolute contraindication takes no reason (nothing unlocks it); a caution needs one.
    if (
      question.severity === 'caution' &&
      entry?.answer === 'yes' &&
      entry.overrideReason.trim() === ''
    ) {
      problems.push({
        field: `checklist.${question.id}.overrideReason`,
        message: 'A yes to a caution needs the reason to go on with treatment',
      });
    }
  }

  // The server refuses to save a second open order without a reason of substance; ask first.
  const duplicate = duplicateOrderProblem(context.openOrders ?? [], draft.duplicateOrderReason);
  if (duplicate) problems.push({ field: 'duplicateOrderReason', message: duplicate.message });

  const schema: z.ZodType = context.mode === 'amend' ? amendOrderSchema : orderDraftSchema;
  const parsed = schema.safeParse(draft);
  if (!parsed.success) {
    for (const issue of parsed.error.issues) {
      const path = issue.path.map(String).join('.');
      const field = formFieldFor(path, draft);
      if (field === null) unplaced.push(issue.message);
      else if (!problems.some((p) => p.field === field))
        problems.push({ field, message: issue.message });
    }
  }
  return { draft, problems, unplaced };
}

/**
 * What still stands between the form and a signature, in words, once the plan is worked out: the
 * shared readiness rules (shared/orders/readiness.ts) over what is typed, reasons not yet tied to
 * a warning included, plus a retreatment reason when the server warned of a recent treatment.
 */
export function formReadiness(
  values: OrderFormValues,
  context: OrderFormContext,
  plan: DosePlan,
  {
    weightChange,
    facts,
  }: {
    weightChange: WeightChange | null;
    /** What the server knows of this patient that a signature is held to (GET /orders/signing-facts). */
    facts: { recentTreatmentDays: number | null; openOrders: readonly OpenOrderFact[] };
  },
): string[] {
  if (!context.definition) return [];
  // The same function the server signs by, fed with the server's facts about this patient.
  const { draft } = checkOrderForm(values, { ...context, warnedFields: null });
  return signatureProblems({
    definition: context.definition,
    plan,
    checklist: draft.checklist,
    softLimitReasons: draft.softLimitReasons,
    retreatmentReason: draft.retreatmentReason ?? null,
    recentTreatmentDays: facts.recentTreatmentDays,
    weightChange,
    weightChangeReason: draft.weightChangeReason ?? null,
    swellingAcknowledged: draft.swellingAcknowledged ?? false,
    openOrders: [...facts.openOrders],
    duplicateOrderReason: draft.duplicateOrderReason ?? null,
  }).map((p) => p.message);
}

/** react-hook-form resolver: the same checks, with each problem beside its own field. */
export const orderFormResolver: Resolver<OrderFormValues, OrderFormContext> = (values, context) => {
  if (!context) throw new Error('the order form needs its context');
  const { problems, unplaced } = checkOrderForm(values, context);
  if (problems.length === 0 && unplaced.length === 0) return { values, errors: {} };
  const errors: Record<string, unknown> = {};
  for (const problem of problems)
    setNested(errors, problem.field, { type: 'validate', message: problem.message });
  if (unplaced.length > 0)
    setNested(errors, 'root.form', { type: 'validate', message: unplaced.join('; ') });
  return { values: {}, errors: errors as FieldErrors<OrderFormValues> };
};
