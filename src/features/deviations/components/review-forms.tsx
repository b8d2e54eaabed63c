import { zodResolver } from '@hookform/resolvers/zod';
import { useId } from 'react';
import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import {
  closeDeviationSchema,
  reopenDeviationSchema,
  reviewClassifications,
} from '../../../../shared/schemas/reviews';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { ArchiveBoxIcon, TurnBackIcon } from '../../../components/ui/icons';
import { FieldError } from '../../../components/ui/text-field';
import { describeError, isApiRequestError } from '../../../lib/api-client';
import {
  applyServerFieldErrors,
  readableMessage,
  unplacedFieldProblems,
} from '../../../lib/form-errors';
import { useCloseDeviation } from '../hooks/use-close-deviation';
import { useReopenDeviation } from '../hooks/use-reopen-deviation';
import { classificationIcons } from './deviation-badges';
import { classificationWords, reviewFieldWords } from './deviation-words';
import { TextAreaField } from '../../../components/ui/text-area-field';

type CloseInput = z.input<typeof closeDeviationSchema>;
type CloseOutput = z.output<typeof closeDeviationSchema>;
const closeFields = ['classification', 'comment'] as const;

/** What went wrong with a review request, where no field can show it. */
function RequestProblem({
  error,
  title,
  fields,
}: {
  error: unknown;
  title: string;
  fields: readonly string[];
}) {
  if (!error) return null;
  const fieldLevel = isApiRequestError(error) && error.status === 400 && error.fields.length > 0;
  const unplaced = isApiRequestError(error) ? unplacedFieldProblems(error, fields) : [];
  if (fieldLevel && unplaced.length === 0)
    return <Alert tone="error" title={`${title}: check the fields marked below`} />;
  return (
    <Alert tone="error" title={title}>
      {unplaced.length > 0 ? (
        <ul className="list-disc pl-5">
          {unplaced.map((problem) => (
            <li key={problem}>{readableMessage(problem, reviewFieldWords)}</li>
          ))}
        </ul>
      ) : (
        describeError(error)
      )}
    </Alert>
  );
}

/** The auditor's judgement: one classification and a comment, both required by the server. */
export function CloseDeviationForm({
  deviationId,
  onOutcome,
}: {
  deviationId: number;
  onOutcome: (text: string) => void;
}) {
  const close = useCloseDeviation();
  const legendId = useId();
  const classificationErrorId = useId();
  const {
    register,
    handleSubmit,
    setError,
    reset,
    formState: { errors },
  } = useForm<CloseInput, unknown, CloseOutput>({
    resolver: zodResolver(closeDeviationSchema),
    defaultValues: { comment: '' },
  });

  // mutateAsync: a successful closure replaces this form with the reopening one, and the outcome
  // must still reach the screen after this form has gone.
  const onSubmit = handleSubmit(async (values) => {
    try {
      await close.mutateAsync({ id: deviationId, ...values });
      reset({ comment: '' });
      onOutcome(
        `Deviation ${deviationId} closed as ${classificationWords[values.classification].label.toLowerCase()}.`,
      );
    } catch (error) {
      if (!isApiRequestError(error)) return;
      if (error.status === 400) applyServerFieldErrors(error, setError, closeFields);
      if (error.status === 409)
        onOutcome(`${error.message} The screen now shows the deviation as it stands.`);
    }
  });

  const classificationError =
    errors.classification?.type === 'server'
      ? readableMessage(errors.classification.message, reviewFieldWords)
      : errors.classification
        ? 'Choose one classification: Acceptable, Needs follow-up or Incident.'
        : undefined;

  return (
    <form
      onSubmit={onSubmit}
      noValidate
      aria-label="Close the deviation"
      className="flex flex-col gap-5"
    >
      <RequestProblem
        error={close.error}
        title="The deviation was not closed"
        fields={closeFields}
      />
      <fieldset aria-describedby={classificationError ? classificationErrorId : undefined}>
        <legend id={legendId} className="mb-2 font-medium text-paper-900">
          Classification
        </legend>
        <div className="flex flex-col gap-2">
          {reviewClassifications.map((classification) => {
            const Icon = classificationIcons[classification];
            const id = `${legendId}-${classification}`;
            return (
              <div
                key={classification}
                className="flex items-start gap-3 rounded-lg border border-paper-300 bg-white px-3 py-2.5 has-[:checked]:border-2 has-[:checked]:border-iris-700 has-[:checked]:bg-iris-50"
              >
                <input
                  id={id}
                  type="radio"
                  value={classification}
                  aria-describedby={`${id}-meaning`}
                  aria-invalid={classificationError ? true : undefined}
                  className="mt-1 size-5 shrink-0 cursor-pointer accent-iris-700"
                  {...register('classification')}
                />
                <div className="min-w-0">
                  <label
                    htmlFor={id}
                    className="inline-flex cursor-pointer items-center gap-1.5 font-medium text-paper-950"
                  >
                    <Icon className="size-4" />
                    {classificationWords[classification].label}
                  </label>
                  <p id={`${id}-meaning`} className="text-sm text-paper-700">
                    {classificationWords[classification].meaning}
                  </p>
                </div>
              </div>
            );
          })}
        </div>
        <div className="mt-2">
          <FieldError id={classificationErrorId} message={classificationError} />
        </div>
      </fieldset>
      <TextAreaField
        rows={4}
        label="Comment"
        hint="3 to 2000 characters: what you found and why you judge it so. It stays in the deviation’s history."
        error={readableMessage(errors.comment?.message, reviewFieldWords)}
        {...register('comment')}
      />
      <div>
        <Button type="submit" busy={close.isPending} icon={<ArchiveBoxIcon />}>
          {close.isPending ? 'Closing…' : 'Close the deviation'}
        </Button>
      </div>
    </form>
  );
}

type ReopenInput = z.input<typeof reopenDeviationSchema>;
type ReopenOutput = z.output<typeof reopenDeviationSchema>;
const reopenFields = ['comment'] as const;

/** Reopening takes the deviation back to the queue; the comment says why. */
export function ReopenDeviationForm({
  deviationId,
  onOutcome,
}: {
  deviationId: number;
  onOutcome: (text: string) => void;
}) {
  const reopen = useReopenDeviation();
  const {
    register,
    handleSubmit,
    setError,
    reset,
    formState: { errors },
  } = useForm<ReopenInput, unknown, ReopenOutput>({
    resolver: zodResolver(reopenDeviationSchema),
    defaultValues: { comment: '' },
  });

  const onSubmit = handleSubmit(async (values) => {
    try {
      await reopen.mutateAsync({ id: deviationId, ...values });
      reset({ comment: '' });
      onOutcome(`Deviation ${deviationId} reopened.`);
    } catch (error) {
      if (!isApiRequestError(error)) return;
      if (error.status === 400) applyServerFieldErrors(error, setError, reopenFields);
      if (error.status === 409)
        onOutcome(`${error.message} The screen now shows the deviation as it stands.`);
    }
  });

  return (
    <form
      onSubmit={onSubmit}
      noValidate
      aria-label="Reopen the deviation"
      className="flex flex-col gap-5"
    >
      <RequestProblem
        error={reopen.error}
        title="The deviation was not reopened"
        fields={reopenFields}
      />
      <TextAreaField
        rows={4}
        label="Why reopen it"
        hint="3 to 2000 characters. The earlier judgement stays in the history."
        error={readableMessage(errors.comment?.message, { comment: 'Why reopen it' })}
        {...register('comment')}
      />
      <div>
        <Button type="submit" variant="secondary" busy={reopen.isPending} icon={<TurnBackIcon />}>
          {reopen.isPending ? 'Reopening…' : 'Reopen the deviation'}
        </Button>
      </div>
    </form>
  );
}
