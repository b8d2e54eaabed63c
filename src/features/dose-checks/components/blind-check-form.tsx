import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { KeptDraftOffer } from '../../../components/ui/kept-draft-offer';
import { overDefaults, useFormDraft } from '../../../lib/form-draft';
import { z } from 'zod';
import type { DoseCheckEntry, OrderDetail } from '../../../../shared/schemas/orders';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { AlertIcon } from '../../../components/ui/icons';
import { TextField } from '../../../components/ui/text-field';
import { describeError, isApiRequestError } from '../../../lib/api-client';
import { readableMessage, unplacedFieldProblems } from '../../../lib/form-errors';
import type { ProtocolDrugParameters } from '../api/get-protocol-drug';
import { useSubmitDoseCheck } from '../hooks/use-submit-dose-check';
import { quantity, unitTime } from './display-format';
import {
  checkedFigures,
  figureLabels,
  figureMaximum,
  figureTolerance,
  figureUnits,
  figureWords,
  isCheckedFigure,
  refusalsBeforeReturn,
  type CheckedFigure,
} from './dose-figures';

/** A typed figure: a point or a comma for decimals, then the server's own range. */
function figureText(field: CheckedFigure) {
  const label = figureLabels[field];
  const unit = figureUnits[field];
  const rule = `${label} must be a number greater than 0 and at most ${figureMaximum[field]} ${unit}`;
  return z
    .string()
    .trim()
    .min(
      1,
      `Enter your ${figureWords[field]} in ${unit}: a number greater than 0 and at most ${figureMaximum[field]}`,
    )
    .transform((text) => Number(text.replace(',', '.')))
    .pipe(z.number({ error: rule }).positive(rule).max(figureMaximum[field], rule));
}

const checkFormSchema = z.object({
  bsaM2: figureText('bsaM2'),
  doseMg: figureText('doseMg'),
  drugVolumeMl: figureText('drugVolumeMl'),
  comment: z
    .string()
    .trim()
    .max(1000, 'Comment must be at most 1000 characters')
    .transform((text) => (text === '' ? null : text)),
});
type CheckFormInput = z.input<typeof checkFormSchema>;

const fieldNames = ['bsaM2', 'doseMg', 'drugVolumeMl', 'comment'] as const;
const labels = { ...figureLabels, comment: 'Comment' };

type BlindCheckFormProps = {
  order: OrderDetail;
  protocol: ProtocolDrugParameters | undefined;
};

/** On a match the order comes back checked and the screen shows the plan in this form's place. */
const checkDefaults: CheckFormInput = { bsaM2: '', doseMg: '', drugVolumeMl: '', comment: '' };

export function BlindCheckForm({ order, protocol }: BlindCheckFormProps) {
  const submit = useSubmitDoseCheck();
  const {
    register,
    handleSubmit,
    setError,
    watch,
    reset,
    getValues,
    formState: { errors },
  } = useForm<CheckFormInput, unknown, DoseCheckEntry>({
    resolver: zodResolver(checkFormSchema),
    defaultValues: checkDefaults,
  });
  const draftKeeper = useFormDraft(
    `dose-check.${order.id}`,
    { watch, reset, getValues },
    { settle: overDefaults(checkDefaults) },
  );

  const refusals = order.doseChecks.filter((check) => check.outcome === 'mismatch');
  const lastTry = refusals.length >= refusalsBeforeReturn - 1;
  const tolerances = protocol?.definition.tolerances.doseCheck ?? null;

  const onSubmit = handleSubmit((entry) => {
    submit.mutate(
      { orderId: order.id, entry },
      {
        onSuccess: draftKeeper.clear,
        onError: (error) => {
          if (!isApiRequestError(error)) return;
          let focused = false;
          for (const problem of error.fields) {
            const field = fieldNames.find((name) => name === problem.path);
            if (!field) continue;
            const message =
              error.status === 422 && isCheckedFigure(field)
                ? `Differs from the plan by more than ${tolerances ? `±${quantity(tolerances[figureTolerance[field]], '%')}` : 'the protocol’s tolerance'}. Work this figure out again.`
                : (readableMessage(problem.message, labels) ?? problem.message);
            setError(field, { type: 'server', message }, { shouldFocus: !focused });
            focused = true;
          }
        },
      },
    );
  });

  const error = submit.error;
  const mismatch = isApiRequestError(error) && error.code === 'dose_check_mismatch';
  const unplaced = isApiRequestError(error) ? unplacedFieldProblems(error, fieldNames) : [];

  return (
    <form
      onSubmit={onSubmit}
      noValidate
      aria-labelledby="blind-check-heading"
      className="rounded-2xl border-2 border-iris-300 bg-white p-6"
    >
      <h2 id="blind-check-heading" className="text-xl font-semibold text-paper-950">
        Your figures
      </h2>
      <KeptDraftOffer draft={draftKeeper} what="figures" />
      <p className="mt-1 mb-5 text-paper-700">
        Work them out from the measurements and the protocol’s figures, rounded as the protocol
        says. A point or a comma may mark the decimals.
      </p>

      {refusals.length > 0 && (
        <div className="mb-5 space-y-3">
          <h3 className="font-semibold text-paper-900">
            Earlier {refusals.length === 1 ? 'attempt' : 'attempts'}
          </h3>
          <ul className="space-y-1.5 text-sm text-paper-800">
            {refusals.map((check) => (
              <li key={check.id} className="flex items-start gap-2">
                <AlertIcon className="mt-0.5 size-4 text-alarm-700" />
                <span>
                  {unitTime(check.createdAt)}
                  {check.pharmacist ? `, ${check.pharmacist.displayName}` : ''}:{' '}
                  {quantity(check.entered.bsaM2, 'm²')}, {quantity(check.entered.doseMg, 'mg')},{' '}
                  {quantity(check.entered.drugVolumeMl, 'mL')} — differed from the plan in{' '}
                  {check.differing
                    .map((path) => (isCheckedFigure(path) ? figureWords[path] : path))
                    .join(', ')}
                  .
                </span>
              </li>
            ))}
          </ul>
        </div>
      )}

      {lastTry && (
        <Alert
          tone="info"
          live="none"
          title="This is the last try before the order goes back"
          className="mb-5"
        >
          If these figures differ from the plan again, the order is sent back to the clinician who
          signed it. Say in the comment what you found (for example, a weight that looks like
          pounds), so they can put it right.
        </Alert>
      )}

      {error &&
        (mismatch ? (
          <Alert tone="error" title="Your figures differ from the plan" className="mb-5">
            <p>
              Outside the tolerance:{' '}
              {error.fields
                .map((problem) => problem.path)
                .filter(isCheckedFigure)
                .map((field) => figureWords[field])
                .join(', ')}
              . Work {error.fields.length === 1 ? 'that figure' : 'those figures'} out again from
              the start; one more difference sends the order back to the clinician.
            </p>
          </Alert>
        ) : (
          <Alert tone="error" title="The check was not recorded" className="mb-5">
            <p>{describeError(error)}</p>
            {unplaced.length > 0 && (
              <ul className="list-disc pl-5">
                {unplaced.map((problem) => (
                  <li key={problem}>{readableMessage(problem, labels)}</li>
                ))}
              </ul>
            )}
          </Alert>
        ))}

      <div className="grid gap-5 sm:grid-cols-3 lg:grid-cols-1">
        {checkedFigures.map((field) => (
          <TextField
            key={field}
            label={`${figureLabels[field]} (${figureUnits[field]})`}
            inputMode="decimal"
            autoComplete="off"
            spellCheck={false}
            className="numerals-steady"
            error={errors[field]?.message}
            {...register(field)}
          />
        ))}
      </div>
      <div className="mt-5 flex flex-col gap-1.5">
        <label htmlFor="dose-check-comment" className="font-medium text-paper-900">
          {lastTry ? 'Comment for the clinician' : 'Comment (optional)'}
        </label>
        <p id="dose-check-comment-hint" className="text-sm text-paper-600">
          {lastTry
            ? 'Sent with the order if it goes back. Up to 1000 characters.'
            : 'Kept with your check. Up to 1000 characters.'}
        </p>
        <textarea
          id="dose-check-comment"
          rows={3}
          aria-describedby={`dose-check-comment-hint${errors.comment ? ' dose-check-comment-error' : ''}`}
          aria-invalid={errors.comment ? true : undefined}
          className={`w-full rounded-lg border bg-white px-3 py-2 text-base text-paper-950 ${errors.comment ? 'border-2 border-alarm-700' : 'border-paper-500'}`}
          {...register('comment')}
        />
        {errors.comment?.message && (
          <p
            id="dose-check-comment-error"
            className="flex items-start gap-1.5 text-sm font-medium text-alarm-700"
          >
            <AlertIcon className="mt-px size-4" />
            <span>{errors.comment.message}</span>
          </p>
        )}
      </div>
      <div className="mt-6">
        <Button type="submit" busy={submit.isPending}>
          {submit.isPending ? 'Comparing…' : 'Compare with the plan'}
        </Button>
      </div>
    </form>
  );
}
