import { bmiText } from '../../../../shared/engine/body-mass-index';
import { formatMeasureWithConversion } from '../../../../shared/engine/units';
import type { PlanInputs } from '../../../../shared/schemas/calculation';

type BodyMeasuresProps = {
  inputs: Pick<PlanInputs, 'height' | 'weight'>;
  /** From the plan, when it has one (plans frozen before engine 1.1 have none). */
  bmiKgPerM2?: number | null;
  className?: string;
};

/**
 * Height, weight and BMI as they are checked: each measure in the unit typed and in the other
 * system, so "92 lb (41.7 kg)" shows a weight typed in the wrong unit at a glance.
 */
export function BodyMeasures({ inputs, bmiKgPerM2, className = '' }: BodyMeasuresProps) {
  if (!inputs.height && !inputs.weight) return null;
  return (
    <dl className={`grid grid-cols-[max-content_1fr] gap-x-4 gap-y-1 ${className}`}>
      {inputs.height && (
        <>
          <dt className="text-paper-600">Height</dt>
          <dd className="numerals-steady font-semibold whitespace-nowrap text-paper-950">
            {formatMeasureWithConversion(inputs.height)}
          </dd>
        </>
      )}
      {inputs.weight && (
        <>
          <dt className="text-paper-600">Weight</dt>
          <dd className="numerals-steady font-semibold whitespace-nowrap text-paper-950">
            {formatMeasureWithConversion(inputs.weight)}
          </dd>
        </>
      )}
      {typeof bmiKgPerM2 === 'number' && (
        <>
          <dt className="text-paper-600">BMI</dt>
          <dd className="numerals-steady font-semibold whitespace-nowrap text-paper-950">
            {bmiText(bmiKgPerM2)}
          </dd>
        </>
      )}
    </dl>
  );
}
