import type { FieldProblem } from '../../../../shared/engine/plan-input-error';
import type { PlanInputs } from '../../../../shared/schemas/calculation';
import { AlertIcon, CheckCircleIcon, InfoIcon, SpinnerIcon } from '../../../components/ui/icons';
import type { PlanPreview } from '../hooks/use-plan-preview';
import { BodyMeasures } from './body-measures';
import { PlanFigures, PlanWarnings, PlanWorking } from './plan-view';

const sentence = (message: string) => message.charAt(0).toUpperCase() + message.slice(1);

type PlanPreviewPanelProps = {
  preview: PlanPreview;
  /** What the plan was worked out from: height and weight are shown in both units. */
  inputs: PlanInputs;
  protocolChosen: boolean;
  /** Problems the engine reported for boxes still empty: what is needed before a plan can be shown. */
  missing: readonly FieldProblem[];
  /** What would stop the signature, worked out from the same rules the server applies. */
  signatureProblems: readonly string[] | null;
};

export function PlanPreviewPanel({
  preview,
  inputs,
  protocolChosen,
  missing,
  signatureProblems,
}: PlanPreviewPanelProps) {
  return (
    <section
      aria-labelledby="plan-preview-heading"
      className="space-y-4 rounded-2xl border border-iris-200 bg-white p-5"
    >
      <div>
        <h2 id="plan-preview-heading" className="text-xl font-semibold text-paper-950">
          Live preview of the plan
        </h2>
        <p className="mt-1 text-sm text-paper-700">
          Worked out in this browser as you type. The server computes the plan again on saving and
          at signing; its figures are the ones kept.
        </p>
      </div>

      {!protocolChosen || preview.state === 'waiting' ? (
        <p className="flex items-start gap-2 text-paper-700">
          <InfoIcon className="mt-0.5 size-5" />
          {protocolChosen
            ? 'Loading the protocol version…'
            : 'Choose a protocol version and enter the measurements to see the plan.'}
        </p>
      ) : preview.state === 'working' ? (
        <p className="flex items-center gap-2 text-paper-700">
          <SpinnerIcon className="size-5 text-iris-700" /> Working out the plan…
        </p>
      ) : preview.state === 'failed' ? (
        <p className="flex items-start gap-2 text-alarm-700">
          <AlertIcon className="mt-0.5 size-5" />
          The preview could not be worked out in this browser. Saving still works: the server
          computes the plan and shows it on the order.
        </p>
      ) : preview.state === 'refused' ? (
        <div className="space-y-2">
          <p className="font-medium text-paper-900">No plan yet.</p>
          {missing.length > 0 && (
            <>
              <p className="text-sm text-paper-700">Still to enter:</p>
              <ul className="list-disc space-y-1 pl-5 text-sm text-paper-900">
                {missing.map((p) => (
                  <li key={p.path}>{sentence(p.message)}</li>
                ))}
              </ul>
            </>
          )}
          {preview.problems.length > missing.length && (
            <p className="text-sm text-alarm-700">
              Some values are outside the allowed range: see the messages beside the fields.
            </p>
          )}
        </div>
      ) : (
        <div className="space-y-4">
          <BodyMeasures
            inputs={inputs}
            bmiKgPerM2={preview.plan.bmiKgPerM2}
            className="rounded-lg border border-paper-200 px-3 py-2"
          />
          <PlanFigures plan={preview.plan} compact />
          <PlanWarnings warnings={preview.plan.warnings} title="The plan warns" />
          <PlanWorking working={preview.plan.working} compact />
        </div>
      )}

      {signatureProblems !== null && (
        <div className="border-t border-paper-200 pt-3">
          <h3 className="mb-1 font-semibold text-paper-900">Before it can be signed</h3>
          {signatureProblems.length === 0 ? (
            <p className="flex items-center gap-2 text-sm text-paper-800">
              <CheckCircleIcon className="size-5" />
              Nothing missing: save the draft, then sign it on the order’s page.
            </p>
          ) : (
            <ul className="list-disc space-y-1 pl-5 text-sm text-paper-900">
              {signatureProblems.map((problem) => (
                <li key={problem}>{sentence(problem)}</li>
              ))}
            </ul>
          )}
        </div>
      )}
    </section>
  );
}
