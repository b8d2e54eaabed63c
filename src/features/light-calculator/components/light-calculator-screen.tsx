import { useCallback, useState } from 'react';
import type { LightSolution } from '../../../../shared/schemas/calculation';
import { PageHeader } from '../../../components/ui/page-header';
import { LightCalculatorForm } from './light-calculator-form';
import { LightCaution } from './light-caution';
import { LightSolutionView } from './light-solution-view';

export function LightCalculatorScreen() {
  const [solution, setSolution] = useState<LightSolution | null>(null);
  const clear = useCallback(() => setSolution(null), []);
  return (
    <>
      <PageHeader
        title="Light calculator"
        lead="Power, spot, irradiance, time, fluence and energy for any laser or UV source: give what you know, and the rest is worked out with every step shown."
      />
      <div className="space-y-6">
        <LightCaution />
        <LightCalculatorForm onSolved={(s) => setSolution(s)} onCleared={clear} />
        <div aria-live="polite">{solution && <LightSolutionView solution={solution} />}</div>
      </div>
    </>
  );
}
