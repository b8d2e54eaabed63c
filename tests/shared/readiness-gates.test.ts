import { describe, expect, it } from 'vitest';
import { computePlan } from '../../shared/engine/compute-plan';
import {
  answeredCautions,
  signatureProblems,
  type ReadinessInput,
} from '../../shared/orders/readiness';
import { reasonOfSubstanceProblem } from '../../shared/orders/reason-of-substance';
import type { ChecklistAnswer } from '../../shared/schemas/orders';
import { loadProtocol } from './support/shipped-protocols';

const pdt = loadProtocol('pdt-standard', 2);
const cxlStandard = loadProtocol('cxl-standard', 2);
const cxlAccelerated = loadProtocol('cxl-accelerated', 2);
const pdtPlan = computePlan(pdt, {
  height: { value: 170, unit: 'cm' },
  weight: { value: 70, unit: 'kg' },
  lesionGldUm: 2000,
  lensMagnification: 1,
});

function allNo(definition: ReadinessInput['definition']): ChecklistAnswer[] {
  return definition.contraindications.map((c) => ({ id: c.id, answer: 'no' }));
}

function input(overrides: Partial<ReadinessInput>): ReadinessInput {
  return {
    definition: pdt,
    plan: pdtPlan,
    checklist: allNo(pdt),
    softLimitReasons: {},
    retreatmentReason: null,
    recentTreatmentDays: null,
    swellingAcknowledged: false,
    weightChange: null,
    weightChangeReason: null,
    openOrders: [],
    duplicateOrderReason: null,
    ...overrides,
  };
}

function answer(
  definition: ReadinessInput['definition'],
  id: string,
  value: ChecklistAnswer,
): ChecklistAnswer[] {
  return allNo(definition).map((a) => (a.id === id ? value : a));
}

describe('a reason of substance', () => {
  it.each([
    ['', 'empty'],
    ['n/a', 'too short'],
    ['ok ok ok ok ok ok ok', 'one word repeated'],
    ['see notes as above', 'filler only'],
    ['moderate or severe hepatic impairment', 'the question said back'],
    ['.....................', 'no words'],
  ])('refuses "%s" (%s)', (reason) => {
    expect(
      reasonOfSubstanceProblem(
        reason,
        'Does the patient have moderate or severe hepatic impairment?',
      ),
    ).not.toBeNull();
  });

  it('accepts a reason that says why treatment is still right', () => {
    expect(
      reasonOfSubstanceProblem(
        'Mild, stable; hepatology agrees with treatment.',
        'Does the patient have moderate or severe hepatic impairment?',
      ),
    ).toBeNull();
  });
});

describe('gate 1: absolute contraindications and cautions', () => {
  it('an absolute contraindication answered yes blocks the signature whatever the reason', () => {
    // Porphyria is absolute for verteporfin (from memory, per the protocol file).
    const checklist = answer(pdt, 'porphyria', {
      id: 'porphyria',
      answer: 'yes',
      overrideReason: 'Haematology reviewed and advised that treatment may go ahead.',
    });
    const problems = signatureProblems(input({ checklist }));

    expect(problems).toEqual([
      expect.objectContaining({
        path: 'checklist.porphyria.answer',
        message: expect.stringMatching(/absolute contraindication.*no reason unlocks it/),
      }),
    ]);
  });

  it('a caution answered yes needs a reason of substance, and is then listed for the banner', () => {
    const weak = answer(pdt, 'hepatic-impairment', {
      id: 'hepatic-impairment',
      answer: 'yes',
      overrideReason: 'ok ok',
    });
    expect(signatureProblems(input({ checklist: weak })).map((p) => p.path)).toEqual([
      'checklist.hepatic-impairment.overrideReason',
    ]);

    const good = answer(pdt, 'hepatic-impairment', {
      id: 'hepatic-impairment',
      answer: 'yes',
      overrideReason: 'Mild, stable; hepatology agrees with treatment.',
    });
    expect(signatureProblems(input({ checklist: good }))).toEqual([]);
    expect(answeredCautions(pdt, good)).toEqual([
      {
        id: 'hepatic-impairment',
        question: 'Does the patient have moderate or severe hepatic impairment?',
        reason: 'Mild, stable; hepatology agrees with treatment.',
      },
    ]);
  });
});

describe('gate 2: do-not-treat CXL plans', () => {
  // Minimum 400 µm before UV (Spoerl E et al., Cornea 2007).
  const thin = (definition: ReadinessInput['definition']) =>
    computePlan(definition, { stromalThicknessUm: 380 });

  it('a stroma below the minimum on a protocol without a swelling step cannot be signed', () => {
    const problems = signatureProblems(
      input({
        definition: cxlAccelerated,
        plan: thin(cxlAccelerated),
        checklist: answer(cxlAccelerated, 'thin-stroma', { id: 'thin-stroma', answer: 'no' }),
      }),
    );

    expect(problems.map((p) => p.path)).toContain('inputs.stromalThicknessUm');
  });

  it('with a swelling step the clinician must acknowledge it', () => {
    const checklist = answer(cxlStandard, 'thin-stroma', {
      id: 'thin-stroma',
      answer: 'yes',
      overrideReason: 'Swelling with hypo-osmolar riboflavin planned, re-measured before UV.',
    });
    const base = { definition: cxlStandard, plan: thin(cxlStandard), checklist };

    expect(signatureProblems(input(base)).map((p) => p.path)).toEqual(['swellingAcknowledged']);
    expect(signatureProblems(input({ ...base, swellingAcknowledged: true }))).toEqual([]);
  });

  it('a checklist answer that contradicts the measured thickness is refused', () => {
    // "thin stroma: no" with 380 µm entered, and "yes" with 460 µm entered.
    const no = signatureProblems(
      input({
        definition: cxlStandard,
        plan: thin(cxlStandard),
        checklist: allNo(cxlStandard),
        swellingAcknowledged: true,
      }),
    );
    expect(no).toEqual([
      expect.objectContaining({
        path: 'checklist.thin-stroma.answer',
        message: expect.stringMatching(/380 µm\) is below the minimum of 400 µm/),
      }),
    ]);

    const thick = computePlan(cxlStandard, { stromalThicknessUm: 460 });
    const yes = signatureProblems(
      input({
        definition: cxlStandard,
        plan: thick,
        checklist: answer(cxlStandard, 'thin-stroma', {
          id: 'thin-stroma',
          answer: 'yes',
          overrideReason: 'Thinner point seen on an older map of this eye.',
        }),
      }),
    );
    expect(yes.map((p) => p.path)).toEqual(['checklist.thin-stroma.answer']);
  });

  it('a second open order for the same eye and kind needs a reason of substance, not a placeholder', () => {
    const other = {
      id: 41,
      revision: 1,
      status: 'signed' as const,
      protocolTitle: 'Standard PDT',
      createdAt: '2026-12-01T09:00:00.000Z',
    };
    const without = signatureProblems(input({ openOrders: [other] }));
    expect(without).toEqual([
      expect.objectContaining({
        path: 'duplicateOrderReason',
        message: expect.stringMatching(/order 41 \(Standard PDT, signed\)/),
      }),
    ]);
    expect(
      signatureProblems(input({ openOrders: [other], duplicateOrderReason: 'ok ok' })).map(
        (p) => p.path,
      ),
    ).toEqual(['duplicateOrderReason']);
    expect(
      signatureProblems(
        input({
          openOrders: [other],
          duplicateOrderReason:
            'Order 41 was for the fellow eye by mistake; it is being cancelled.',
        }),
      ),
    ).toEqual([]);
    // No other open order: nothing is asked.
    expect(signatureProblems(input({ openOrders: [] }))).toEqual([]);
  });
});
