import { bsaFormulas, type BsaFormulaName } from '../../../../shared/engine/bsa';
import { formatMeasureWithConversion } from '../../../../shared/engine/units';
import type { PlanInputs } from '../../../../shared/schemas/calculation';
import { quantity } from './display-format';

type OrderInputsProps = {
  inputs: PlanInputs;
  /** The protocol's formula, used when the order names none. */
  defaultFormula: BsaFormulaName | null;
};

/** What the clinician measured and chose: the starting point of the pharmacist's own sum. */
export function OrderInputs({ inputs, defaultFormula }: OrderInputsProps) {
  const formulaName = inputs.bsaFormula ?? defaultFormula;
  const formula = formulaName ? bsaFormulas[formulaName] : null;
  const imperial = inputs.height?.unit === 'in' || inputs.weight?.unit === 'lb';
  return (
    <section
      aria-labelledby="order-inputs-heading"
      className="rounded-2xl border border-paper-200 bg-white px-6 py-5"
    >
      <h2 id="order-inputs-heading" className="text-lg font-semibold text-paper-950">
        The order’s measurements
      </h2>
      <dl className="mt-3 grid grid-cols-[minmax(0,11rem)_1fr] gap-x-5 gap-y-2">
        <dt className="text-paper-700">Height</dt>
        <dd className="numerals-steady font-semibold text-paper-950">
          {inputs.height ? formatMeasureWithConversion(inputs.height) : 'Not given'}
        </dd>
        <dt className="text-paper-700">Weight</dt>
        <dd className="numerals-steady font-semibold text-paper-950">
          {inputs.weight ? formatMeasureWithConversion(inputs.weight) : 'Not given'}
        </dd>
        <dt className="text-paper-700">BSA formula</dt>
        <dd className="text-paper-950">
          {formula ? (
            <>
              <span className="font-semibold">{formula.label}</span>
              {!inputs.bsaFormula && (
                <span className="text-paper-700"> (the protocol’s default)</span>
              )}
              <span className="block text-sm text-paper-700">
                <span className="font-mono">{formula.expression}</span> — {formula.source}
              </span>
            </>
          ) : (
            'Not given'
          )}
        </dd>
        <dt className="text-paper-700">Lesion GLD</dt>
        <dd className="numerals-steady text-paper-950">{quantity(inputs.lesionGldUm, 'µm')}</dd>
        <dt className="text-paper-700">Lens magnification</dt>
        <dd className="numerals-steady text-paper-950">
          {inputs.lensMagnification === undefined
            ? '—'
            : `× ${quantity(inputs.lensMagnification, '')}`}
        </dd>
      </dl>
      {imperial && (
        <p className="mt-3 text-sm text-paper-700">
          Measured in imperial units: 1 in = 2.54 cm, 1 lb = 0.45359237 kg (exact definitions).
        </p>
      )}
    </section>
  );
}
