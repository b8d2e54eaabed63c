import { useQuery } from '@tanstack/react-query';
import { lensesQuery } from '../../../lib/queries/devices';
import { Link } from 'react-router-dom';
import { bmiText } from '../../../../shared/engine/body-mass-index';
import { bsaFormulas } from '../../../../shared/engine/bsa';
import { formatMeasureWithConversion } from '../../../../shared/engine/units';
import type { ProtocolVersion } from '../../../../shared/protocol/protocol-schema';
import type { OrderDetail } from '../../../../shared/schemas/orders';
import { AlertIcon, CheckCircleIcon } from '../../../components/ui/icons';
import { paths } from '../../../config/paths';
import { severityWords } from './contraindication-checklist';
import { formatFigure } from './plan-numbers';
import { fieldWords } from './order-words';
import { formatCalendarDate, formatUnitDateTime } from '../../../lib/unit-times';

function Card({ id, title, children }: { id: string; title: string; children: React.ReactNode }) {
  return (
    <section
      aria-labelledby={`${id}-heading`}
      className="space-y-3 rounded-2xl border border-paper-200 bg-white p-5"
    >
      <h2 id={`${id}-heading`} className="text-xl font-semibold text-paper-950">
        {title}
      </h2>
      {children}
    </section>
  );
}

/** The measurements as entered, with their units. */
export function OrderInputs({ order }: { order: OrderDetail }) {
  const { inputs } = order;
  const lenses = useQuery({ ...lensesQuery(), enabled: inputs.lensId !== undefined });
  const rows: [string, string][] = [];
  if (inputs.height) rows.push(['Height', formatMeasureWithConversion(inputs.height)]);
  if (inputs.weight) rows.push(['Weight', formatMeasureWithConversion(inputs.weight)]);
  if (typeof order.plan?.bmiKgPerM2 === 'number')
    rows.push(['Body-mass index', bmiText(order.plan.bmiKgPerM2)]);
  if (inputs.bsaFormula) rows.push(['BSA formula', bsaFormulas[inputs.bsaFormula].label]);
  else if (order.kind === 'pdt') rows.push(['BSA formula', 'Protocol default']);
  if (inputs.lesionGldUm !== undefined)
    rows.push(['Lesion greatest linear dimension', `${formatFigure(inputs.lesionGldUm)} µm`]);
  const lensName = lenses.data?.find((l) => l.id === inputs.lensId)?.name;
  if (inputs.lensId !== undefined)
    rows.push(['Contact lens', lensName ?? `lens ${inputs.lensId} of the register`]);
  if (inputs.lensMagnification !== undefined)
    rows.push(['Lens laser-spot magnification', `× ${formatFigure(inputs.lensMagnification)}`]);
  if (inputs.stromalThicknessUm !== undefined)
    rows.push(['Thinnest stromal thickness', `${formatFigure(inputs.stromalThicknessUm)} µm`]);
  return (
    <Card id="order-inputs" title="Measurements entered">
      <dl className="grid gap-x-6 gap-y-2 sm:grid-cols-2">
        {rows.map(([label, value]) => (
          <div key={label}>
            <dt className="text-sm text-paper-600">{label}</dt>
            <dd className="numerals-steady font-semibold text-paper-950">{value}</dd>
          </div>
        ))}
      </dl>
    </Card>
  );
}

/** Each checklist question with its answer; a yes shows its override reason. */
export function ChecklistAnswers({
  order,
  definition,
}: {
  order: OrderDetail;
  definition: ProtocolVersion | null;
}) {
  const answers = new Map(order.checklist.map((a) => [a.id, a]));
  const questions =
    definition?.contraindications ??
    order.checklist.map((a) => ({
      id: a.id,
      question: a.id,
      severity: 'caution' as const,
      source: '',
    }));
  return (
    <Card id="order-checklist" title="Contraindication checklist">
      {questions.length === 0 ? (
        <p className="text-paper-700">This protocol version has no contraindication questions.</p>
      ) : (
        <ol className="space-y-2">
          {questions.map((q, index) => {
            const answer = answers.get(q.id);
            return (
              <li
                key={q.id}
                className={`rounded-lg border px-3 py-2 ${answer?.answer === 'yes' ? 'border-alarm-700 bg-alarm-50' : 'border-paper-200'}`}
              >
                <p className="font-medium text-paper-950">
                  <span className="mr-1.5 text-paper-600">{index + 1}.</span>
                  {q.question}
                </p>
                {definition && (
                  <p className="text-sm text-paper-700">{severityWords[q.severity]}.</p>
                )}
                <p className="mt-1 flex items-center gap-1.5 font-semibold">
                  {answer === undefined ? (
                    <>
                      <AlertIcon className="size-4 text-alarm-700" />
                      <span className="text-alarm-700">Not answered</span>
                    </>
                  ) : answer.answer === 'yes' ? (
                    <>
                      <AlertIcon className="size-4 text-alarm-700" />
                      <span className="text-alarm-800">Yes</span>
                    </>
                  ) : (
                    <>
                      <CheckCircleIcon className="size-4" />
                      <span className="text-paper-900">No</span>
                    </>
                  )}
                </p>
                {answer?.answer === 'yes' && q.severity === 'absolute' && (
                  <p className="text-sm text-paper-900">
                    <span className="font-semibold text-alarm-800">
                      An absolute contraindication: no reason unlocks it.
                    </span>
                    {/* Orders signed before the gate may carry the reason they were overridden with. */}
                    {answer.overrideReason && (
                      <> Reason recorded before this rule: {answer.overrideReason}</>
                    )}
                  </p>
                )}
                {answer?.answer === 'yes' && q.severity !== 'absolute' && (
                  <p className="text-sm text-paper-900">
                    <span className="font-medium">Reason: </span>
                    {answer.overrideReason ?? (
                      <span className="text-alarm-700">none given yet</span>
                    )}
                  </p>
                )}
              </li>
            );
          })}
        </ol>
      )}
    </Card>
  );
}

/** Reasons recorded for soft-limit warnings and for a retreatment inside the interval, and the note. */
export function OrderReasons({ order }: { order: OrderDetail }) {
  const reasons = Object.entries(order.softLimitReasons);
  if (
    reasons.length === 0 &&
    !order.retreatmentReason &&
    !order.weightChangeReason &&
    !order.supersededVersionReason &&
    !order.duplicateOrderReason &&
    !order.note
  )
    return null;
  return (
    <Card id="order-reasons" title="Reasons and note">
      <dl className="space-y-2">
        {reasons.map(([field, reason]) => (
          <div key={field}>
            <dt className="text-sm text-paper-600">
              Reason for the {fieldWords[field] ?? field} outside the usual range
            </dt>
            <dd className="text-paper-950">{reason}</dd>
          </div>
        ))}
        {order.retreatmentReason && (
          <div>
            <dt className="text-sm text-paper-600">
              Reason to treat again within the minimum interval
            </dt>
            <dd className="text-paper-950">{order.retreatmentReason}</dd>
          </div>
        )}
        {order.weightChangeReason && (
          <div>
            <dt className="text-sm text-paper-600">
              Reason for the change in weight since the last one recorded
            </dt>
            <dd className="text-paper-950">{order.weightChangeReason}</dd>
          </div>
        )}
        {order.supersededVersionReason && (
          <div>
            <dt className="text-sm text-paper-600">
              Reason for using version {order.protocol.version}, superseded by a newer version
            </dt>
            <dd className="text-paper-950">{order.supersededVersionReason}</dd>
          </div>
        )}
        {order.duplicateOrderReason && (
          <div>
            <dt className="text-sm text-paper-600">Reason for a second open order</dt>
            <dd className="text-paper-950">{order.duplicateOrderReason}</dd>
          </div>
        )}
        {order.note && (
          <div>
            <dt className="text-sm text-paper-600">Note</dt>
            <dd className="whitespace-pre-line text-paper-950">{order.note}</dd>
          </div>
        )}
      </dl>
    </Card>
  );
}

/** The pharmacist's dose checks and the preparation, when there are any. */
export function PharmacyRecord({ order }: { order: OrderDetail }) {
  if (order.doseChecks.length === 0 && !order.preparation) return null;
  return (
    <Card id="order-pharmacy" title="Dose checks and preparation">
      {order.doseChecks.length > 0 && (
        <ol className="space-y-2">
          {order.doseChecks.map((check) => (
            <li
              key={check.id}
              className={`rounded-lg border px-3 py-2 ${check.outcome === 'match' ? 'border-paper-200' : 'border-alarm-700 bg-alarm-50'}`}
            >
              <p className="flex items-center gap-1.5 font-semibold text-paper-950">
                {check.outcome === 'match' ? (
                  <CheckCircleIcon className="size-4" />
                ) : (
                  <AlertIcon className="size-4 text-alarm-700" />
                )}
                {check.outcome === 'match' ? 'Matched the plan' : 'Did not match the plan'}
                <span className="font-normal text-paper-700">
                  · {check.pharmacist?.displayName ?? 'unknown'} ·{' '}
                  {formatUnitDateTime(check.createdAt)}
                </span>
              </p>
              <p className="numerals-steady text-sm text-paper-900">
                Entered: BSA {formatFigure(check.entered.bsaM2)} m², dose{' '}
                {formatFigure(check.entered.doseMg)} mg, drug volume{' '}
                {formatFigure(check.entered.drugVolumeMl)} mL
                {check.differing.length > 0 && <> · differing: {check.differing.join(', ')}</>}
              </p>
              {check.comment && <p className="text-sm text-paper-900">Comment: {check.comment}</p>}
            </li>
          ))}
        </ol>
      )}
      {order.preparation && (
        <dl className="grid gap-x-6 gap-y-2 rounded-lg border border-paper-200 px-3 py-2 sm:grid-cols-2">
          <div>
            <dt className="text-sm text-paper-600">Vial lot</dt>
            <dd className="font-semibold text-paper-950">{order.preparation.vialLot}</dd>
          </div>
          <div>
            <dt className="text-sm text-paper-600">Vial expiry</dt>
            <dd className="font-semibold text-paper-950">
              {formatCalendarDate(order.preparation.vialExpiry)}
            </dd>
          </div>
          <div>
            <dt className="text-sm text-paper-600">Reconstituted</dt>
            <dd className="font-semibold text-paper-950">
              {formatUnitDateTime(order.preparation.reconstitutedAt)}
            </dd>
          </div>
          <div>
            <dt className="text-sm text-paper-600">Volume drawn</dt>
            <dd className="font-semibold text-paper-950">
              {formatFigure(order.preparation.volumeDrawnMl)} mL
            </dd>
          </div>
          <div>
            <dt className="text-sm text-paper-600">Beyond-use time</dt>
            <dd className="font-semibold text-paper-950">
              {formatUnitDateTime(order.preparation.beyondUseAt)}
            </dd>
          </div>
          <div>
            <dt className="text-sm text-paper-600">Prepared by</dt>
            <dd className="font-semibold text-paper-950">
              {order.preparation.pharmacist?.displayName ?? 'unknown'}
            </dd>
          </div>
        </dl>
      )}
    </Card>
  );
}

/** Who, when, which version; revision links. */
export function OrderFacts({ order }: { order: OrderDetail }) {
  return (
    <section
      aria-labelledby="order-facts-heading"
      className="rounded-2xl border border-paper-200 bg-white p-5"
    >
      <h2 id="order-facts-heading" className="mb-3 text-xl font-semibold text-paper-950">
        Record
      </h2>
      <dl className="space-y-2">
        <div>
          <dt className="text-sm text-paper-600">Protocol version</dt>
          <dd>
            <Link
              to={paths.protocolVersion.getHref(order.protocol.key, order.protocol.version)}
              className="font-medium text-iris-700 underline underline-offset-4 hover:text-iris-900"
            >
              {order.protocol.title}, version {order.protocol.version}
            </Link>
          </dd>
        </div>
        <div>
          <dt className="text-sm text-paper-600">Created</dt>
          <dd className="text-paper-950">
            {formatUnitDateTime(order.createdAt)}
            {order.createdBy && <> by {order.createdBy.displayName}</>}
          </dd>
        </div>
        <div>
          <dt className="text-sm text-paper-600">Signed</dt>
          <dd className="text-paper-950">
            {order.signedAt ? (
              <>
                {formatUnitDateTime(order.signedAt)}
                {order.signedBy && <> by {order.signedBy.displayName}</>}
              </>
            ) : (
              'Not yet'
            )}
          </dd>
        </div>
        {order.beyondUseAt && (
          <div>
            <dt className="text-sm text-paper-600">Beyond-use time of the prepared drug</dt>
            <dd className="font-semibold text-paper-950">
              {formatUnitDateTime(order.beyondUseAt)}
            </dd>
          </div>
        )}
        <div>
          <dt className="text-sm text-paper-600">Revision</dt>
          <dd className="text-paper-950">
            {order.revision}
            {order.previousRevisionId !== null && (
              <>
                {' '}
                · replaces{' '}
                <Link
                  to={paths.order.getHref(order.previousRevisionId)}
                  className="text-iris-700 underline underline-offset-4 hover:text-iris-900"
                >
                  order {order.previousRevisionId} (revision {order.revision - 1})
                </Link>
              </>
            )}
            {order.nextRevisionId !== null && (
              <>
                {' '}
                · amended by{' '}
                <Link
                  to={paths.order.getHref(order.nextRevisionId)}
                  className="text-iris-700 underline underline-offset-4 hover:text-iris-900"
                >
                  order {order.nextRevisionId} (revision {order.revision + 1})
                </Link>
              </>
            )}
          </dd>
        </div>
        {order.amendmentReason && (
          <div>
            <dt className="text-sm text-paper-600">Reason for this amendment</dt>
            <dd className="text-paper-950">{order.amendmentReason}</dd>
          </div>
        )}
      </dl>
    </section>
  );
}
