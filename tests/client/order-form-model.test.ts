import { describe, expect, it } from 'vitest';
import { computePlan } from '../../shared/engine/compute-plan';
import {
  checkOrderForm,
  emptyOrderForm,
  formReadiness,
  formToInputs,
  settleFormValues,
  type OrderFormContext,
  type OrderFormValues,
} from '../../src/features/orders/components/order-form-values';
import { loadProtocol } from '../shared/support/shipped-protocols';

// The order form's model below the browser: how what react-hook-form reports is made whole, what
// is sent, and what still stands before a signature. The measurements are made up and inside the
// shipped protocol's soft limits; no clinical figure is checked here (the engine's tests do that).

const pdt = loadProtocol('pdt-half-dose', 2);
const noFacts = { recentTreatmentDays: null, openOrders: [] };
const context = (mode: OrderFormContext['mode'] = 'new'): OrderFormContext => ({
  mode,
  definition: pdt,
  warnedFields: null,
});

const questions = pdt.contraindications.map((question) => question.id);
const allNo = Object.fromEntries(questions.map((id) => [id, { answer: 'no', overrideReason: '' }]));

function filled(changes: Partial<OrderFormValues> = {}): OrderFormValues {
  return {
    ...emptyOrderForm(12),
    eye: 'right',
    protocolRef: `${pdt.key}@${pdt.version}`,
    heightValue: '170',
    weightValue: '70',
    bsaFormula: 'mosteller',
    lesionGldUm: '3000',
    lensMagnification: '1.05',
    checklist: allNo as OrderFormValues['checklist'],
    ...changes,
  };
}

describe('settling what the form reports', () => {
  it('reads fields not registered yet as empty, and a stray value as the default', () => {
    const settled = settleFormValues({
      eye: 'both',
      heightUnit: 'm',
      weightValue: 70,
      bsaFormula: 'guess',
      checklist: { porphyria: { answer: 'maybe' }, 'hepatic-impairment': null },
      softLimitReasons: { inputs__weight__value: 42 },
      swellingAcknowledged: 'yes',
    });
    expect(settled).toEqual({
      ...emptyOrderForm(),
      weightValue: '',
      checklist: {
        porphyria: { answer: '', overrideReason: '' },
        'hepatic-impairment': { answer: '', overrideReason: '' },
      },
      softLimitReasons: { inputs__weight__value: '' },
    });
  });

  it('keeps what was typed as typed, whole form or none', () => {
    expect(settleFormValues(filled())).toEqual(filled());
    expect(settleFormValues(null)).toEqual(emptyOrderForm());
    expect(settleFormValues('a restored draft from long ago')).toEqual(emptyOrderForm());
  });
});

describe('what is sent', () => {
  it('takes a decimal comma, and leaves out the other kind’s measurement', () => {
    const { inputs, invalid } = formToInputs(
      filled({ lensMagnification: '1,05', stromalThicknessUm: '420' }),
      'pdt',
    );
    expect(invalid).toEqual([]);
    expect(inputs).toEqual({
      height: { value: 170, unit: 'cm' },
      weight: { value: 70, unit: 'kg' },
      bsaFormula: 'mosteller',
      lesionGldUm: 3000,
      lensMagnification: 1.05,
    });
  });

  it('names a measurement that is not a number instead of sending it', () => {
    const { problems } = checkOrderForm(filled({ weightValue: '70kg' }), context());
    expect(problems).toContainEqual({
      field: 'weightValue',
      message: 'Weight must be a number, e.g. 180',
    });
  });

  it('finds nothing to stop a complete order, and names each missing field otherwise', () => {
    expect(checkOrderForm(filled(), context()).problems).toEqual([]);
    const fields = checkOrderForm(emptyOrderForm(), context()).problems.map((p) => p.field);
    expect(fields).toEqual(expect.arrayContaining(['patientId', 'eye', 'protocolRef']));
  });

  it('asks for a reason when a caution is answered yes', () => {
    const checklist = { ...allNo, 'hepatic-impairment': { answer: 'yes', overrideReason: ' ' } };
    const { problems } = checkOrderForm(
      filled({ checklist: checklist as OrderFormValues['checklist'] }),
      context(),
    );
    expect(problems.map((p) => p.field)).toEqual(['checklist.hepatic-impairment.overrideReason']);
  });

  it('waits for the protocol version before judging the rest', () => {
    const { problems } = checkOrderForm(filled(), { ...context(), definition: null });
    expect(problems.map((p) => p.field)).toContain('protocolRef');
  });
});

describe('readiness to sign', () => {
  const planFor = (values: OrderFormValues) => computePlan(pdt, formToInputs(values, 'pdt').inputs);

  it('is empty for a complete order with every question answered', () => {
    const values = filled();
    expect(
      formReadiness(values, context(), planFor(values), { weightChange: null, facts: noFacts }),
    ).toEqual([]);
  });

  it('lists an unanswered contraindication question', () => {
    const { porphyria: _open, ...rest } = allNo;
    const values = filled({ checklist: rest as OrderFormValues['checklist'] });
    const problems = formReadiness(values, context(), planFor(values), {
      weightChange: null,
      facts: noFacts,
    });
    expect(problems).toHaveLength(1);
  });

  it('asks for a retreatment reason when the server reports a recent treatment, until one is given', () => {
    // 20 days since the same eye's last PDT, inside the protocol's minimum interval (TAP Study
    // Group 1999: retreatment considered every 3 months at the earliest).
    const facts = { recentTreatmentDays: 20, openOrders: [] };
    const values = filled();
    const asked = formReadiness(values, context(), planFor(values), { weightChange: null, facts });
    expect(asked).toHaveLength(1);
    expect(asked[0]).toMatch(/20 days ago/);
    const reasoned = filled({
      retreatmentReason: 'Leakage persists on angiography after 3 months.',
    });
    expect(
      formReadiness(reasoned, context(), planFor(reasoned), { weightChange: null, facts }),
    ).toEqual([]);
  });

  it('asks for a reason when the patient has another open order for this eye, until one is given', () => {
    const facts = {
      recentTreatmentDays: null,
      openOrders: [
        {
          id: 41,
          revision: 1,
          status: 'signed' as const,
          protocolTitle: 'PDT half dose',
          createdAt: '2026-12-01T09:00:00.000Z',
        },
      ],
    };
    const values = filled();
    expect(
      formReadiness(values, context(), planFor(values), { weightChange: null, facts }),
    ).toHaveLength(1);
    const reasoned = filled({
      duplicateOrderReason: 'The first order is for next month; this one replaces the dose today.',
    });
    expect(
      formReadiness(reasoned, context(), planFor(reasoned), { weightChange: null, facts }),
    ).toEqual([]);
  });
});
