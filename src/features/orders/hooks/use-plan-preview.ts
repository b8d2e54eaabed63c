import { useEffect, useState } from 'react';
import { PlanInputError, type FieldProblem } from '../../../../shared/engine/plan-input-error';
import type { ProtocolVersion } from '../../../../shared/protocol/protocol-schema';
import type { DosePlan, PlanInputs } from '../../../../shared/schemas/calculation';

export type PlanPreview =
  | { state: 'waiting' }
  | { state: 'working' }
  | { state: 'ready'; plan: DosePlan }
  | { state: 'refused'; problems: FieldProblem[] }
  | { state: 'failed' };

// The engine carries mathjs, so it is fetched the first time a preview is needed, not with the page.
let engine: Promise<typeof import('../../../../shared/engine/compute-plan')> | null = null;
function loadEngine() {
  engine ??= import('../../../../shared/engine/compute-plan').catch((error: unknown) => {
    engine = null;
    throw error;
  });
  return engine;
}

/**
 * The dose plan as the shared engine computes it from what is typed so far. A preview only: the
 * server computes the plan again on every save and at signing, and its figures are the ones kept.
 */
export function usePlanPreview(
  definition: ProtocolVersion | null,
  inputs: PlanInputs,
  delayMs = 250,
): PlanPreview {
  const [preview, setPreview] = useState<PlanPreview>({ state: 'waiting' });
  const inputsKey = JSON.stringify(inputs);
  // Without a protocol version there is nothing to preview: back to waiting, decided while
  // rendering (not in an effect) so the stale plan never shows for a frame.
  const [previewedFor, setPreviewedFor] = useState(definition);
  if (previewedFor !== definition) {
    setPreviewedFor(definition);
    if (!definition) setPreview({ state: 'waiting' });
  }

  useEffect(() => {
    if (!definition) return;
    let cancelled = false;
    const timer = setTimeout(() => {
      setPreview((current) => (current.state === 'waiting' ? { state: 'working' } : current));
      loadEngine()
        .then(({ computePlan }) => {
          if (cancelled) return;
          try {
            setPreview({
              state: 'ready',
              plan: computePlan(definition, JSON.parse(inputsKey) as PlanInputs),
            });
          } catch (error) {
            if (error instanceof PlanInputError)
              setPreview({ state: 'refused', problems: error.fields });
            else {
              console.warn('The plan preview could not be computed', error);
              setPreview({ state: 'failed' });
            }
          }
        })
        .catch((error: unknown) => {
          if (cancelled) return;
          console.warn('The calculation engine could not be loaded', error);
          setPreview({ state: 'failed' });
        });
    }, delayMs);
    return () => {
      cancelled = true;
      clearTimeout(timer);
    };
  }, [definition, inputsKey, delayMs]);

  return preview;
}
