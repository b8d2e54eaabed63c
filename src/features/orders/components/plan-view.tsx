import { bsaFormulas } from '../../../../shared/engine/bsa';
import type { DosePlan, PlanWarning, WorkingEntry } from '../../../../shared/schemas/calculation';
import { AlertIcon, CheckCircleIcon, SigmaIcon } from '../../../components/ui/icons';
import { formatFigure, formatSeconds, planFigures } from './plan-numbers';

function FigureValue({
  value,
  unit,
  time,
  signed,
}: {
  value: number;
  unit: string;
  time?: boolean;
  signed?: boolean;
}) {
  if (time) return <>{formatSeconds(value)}</>;
  return (
    <>
      {signed && value > 0 ? '+' : ''}
      {formatFigure(value)}
      {unit && <span className="ml-1 text-[0.8em] font-medium text-paper-700">{unit}</span>}
    </>
  );
}

/** The plan's figures with units; the main ones larger, estimates labelled as such. */
export function PlanFigures({ plan, compact = false }: { plan: DosePlan; compact?: boolean }) {
  const shown = planFigures.filter((f) => typeof plan[f.key] === 'number');
  return (
    <div className="space-y-3">
      <dl
        className={`grid gap-2 ${compact ? 'grid-cols-2' : 'grid-cols-2 sm:grid-cols-3 lg:grid-cols-4'}`}
      >
        {shown.map((f) => (
          <div
            key={f.key}
            className={`rounded-lg border px-3 py-2 ${f.main ? 'border-iris-200 bg-iris-50' : 'border-paper-200 bg-white'}`}
          >
            <dt className="text-sm text-paper-700">
              {f.label}
              {f.estimate && <span className="ml-1 font-medium">(estimate only)</span>}
            </dt>
            <dd
              className={`numerals-steady font-semibold text-paper-950 ${f.main ? 'text-xl' : 'text-lg'}`}
            >
              <FigureValue
                value={plan[f.key] as number}
                unit={f.unit}
                time={f.time}
                signed={f.signed}
              />
            </dd>
          </div>
        ))}
        {plan.thicknessOk !== null && (
          <div className="rounded-lg border border-paper-200 bg-white px-3 py-2">
            <dt className="text-sm text-paper-700">Stroma thick enough for UV</dt>
            <dd className="flex items-center gap-1.5 text-lg font-semibold text-paper-950">
              {plan.thicknessOk ? (
                <CheckCircleIcon className="size-5" />
              ) : (
                <AlertIcon className="size-5 text-alarm-700" />
              )}
              {plan.thicknessOk ? 'Yes' : 'No'}
            </dd>
          </div>
        )}
      </dl>
      <p className="text-sm text-paper-700">
        {plan.bsaFormula && <>BSA by the {bsaFormulas[plan.bsaFormula].label} formula. </>}
        Protocol {plan.protocol.key} version {plan.protocol.version}; engine {plan.engineVersion}.
      </p>
    </div>
  );
}

export function PlanWarnings({
  warnings,
  title = 'Warnings',
}: {
  warnings: readonly PlanWarning[];
  title?: string;
}) {
  if (warnings.length === 0) return null;
  return (
    <div className="rounded-lg border-l-4 border border-alarm-700 bg-alarm-50 px-4 py-3">
      <p className="mb-1 flex items-center gap-2 font-semibold text-alarm-800">
        <AlertIcon className="size-5" />
        {title}
      </p>
      <ul className="list-disc space-y-1 pl-5 text-sm text-paper-900">
        {warnings.map((w) => (
          <li key={`${w.code}-${w.field ?? ''}-${w.message}`}>
            {w.message.charAt(0).toUpperCase() + w.message.slice(1)}
          </li>
        ))}
      </ul>
    </div>
  );
}

function WorkingLine({
  entry,
  index,
  compact,
}: {
  entry: WorkingEntry;
  index: number;
  compact: boolean;
}) {
  const inputs = Object.entries(entry.inputs);
  return (
    <li className="rounded-lg border border-paper-200 bg-white px-3 py-2">
      <p className="flex flex-wrap items-baseline justify-between gap-x-3">
        <span className="font-semibold text-paper-950">
          <span className="mr-1.5 text-sm font-normal text-paper-600">{index + 1}.</span>
          {entry.name}
        </span>
        <span className="numerals-steady font-semibold text-paper-950">
          {formatFigure(entry.rounded?.value ?? entry.value)} {entry.unit}
        </span>
      </p>
      <dl
        className={`mt-1 grid gap-x-3 gap-y-0.5 text-sm ${compact ? 'grid-cols-1 [&>dt]:mt-1' : 'grid-cols-[max-content_1fr]'}`}
      >
        <dt className="text-paper-600">Formula</dt>
        <dd className="font-mono text-[0.85em] text-paper-900 [overflow-wrap:anywhere]">
          {entry.formula}
        </dd>
        <dt className="text-paper-600">Inputs</dt>
        <dd className="text-paper-900 [overflow-wrap:anywhere]">
          {inputs.length === 0
            ? 'none'
            : inputs
                .map(([name, q]) => `${name} = ${formatFigure(q.value)} ${q.unit}`.trim())
                .join('; ')}
        </dd>
        <dt className="text-paper-600">Rounding</dt>
        <dd className="text-paper-900">
          {entry.rounded
            ? `${formatFigure(entry.value)} rounded to the nearest ${formatFigure(entry.rounded.step)} → ${formatFigure(entry.rounded.value)}`
            : 'not rounded'}
        </dd>
        <dt className="text-paper-600">Source</dt>
        <dd className="text-paper-900 [overflow-wrap:anywhere]">{entry.source}</dd>
      </dl>
    </li>
  );
}

/** Every line of the working, folded away until asked for: name, value, unit, formula, inputs, source, rounding. */
export function PlanWorking({
  working,
  compact = false,
}: {
  working: readonly WorkingEntry[];
  compact?: boolean;
}) {
  return (
    <details className="group rounded-lg border border-paper-300 bg-paper-50">
      <summary className="flex min-h-tap cursor-pointer items-center gap-2 rounded-lg px-3 py-2 font-medium text-iris-800 hover:bg-paper-100">
        <SigmaIcon className="size-5" />
        <span className="group-open:hidden">Show the working ({working.length} lines)</span>
        <span className="hidden group-open:inline">Hide the working</span>
      </summary>
      {/* In the narrow preview column the working scrolls in its own box, so the page stays short. */}
      <div
        {...(compact ? { tabIndex: 0, role: 'region', 'aria-label': 'Working, scrollable' } : {})}
        className={compact ? 'max-h-[30rem] overflow-y-auto rounded-b-lg' : ''}
      >
        <ol className="space-y-2 px-3 pt-1 pb-3">
          {working.map((entry, index) => (
            <WorkingLine
              key={`${entry.name}-${index}`}
              entry={entry}
              index={index}
              compact={compact}
            />
          ))}
        </ol>
      </div>
    </details>
  );
}
