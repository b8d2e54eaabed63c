import { useWatch, type Control, type FieldErrors, type UseFormRegister } from 'react-hook-form';
import type { ProtocolVersion } from '../../../../shared/protocol/protocol-schema';
import { FieldError } from '../../../components/ui/text-field';
import type { OrderFormContext, OrderFormValues } from './order-form-values';
import { TextAreaField } from '../../../components/ui/text-area-field';
import {
  minimumSubstantialReasonChars,
  minimumSubstantialReasonWords,
} from '../../../../shared/orders/reason-of-substance';

type Question = ProtocolVersion['contraindications'][number];

export const severityWords: Record<Question['severity'], string> = {
  absolute: 'Absolute contraindication: a yes stops the order, and no reason unlocks it',
  caution: 'Caution: a yes needs a reason of substance saying why treatment is still right',
};

type ChecklistProps = {
  questions: readonly Question[];
  register: UseFormRegister<OrderFormValues>;
  control: Control<OrderFormValues, OrderFormContext>;
  errors: FieldErrors<OrderFormValues>;
  readMessage: (message: string | undefined) => string | undefined;
};

function QuestionBlock({
  question,
  number,
  register,
  control,
  errors,
  readMessage,
}: Omit<ChecklistProps, 'questions'> & { question: Question; number: number }) {
  const answer = useWatch({ control, name: `checklist.${question.id}.answer` });
  const answerError = readMessage(errors.checklist?.[question.id]?.answer?.message);
  const reasonError = readMessage(errors.checklist?.[question.id]?.overrideReason?.message);
  const legendId = `question-${question.id}`;
  const errorId = answerError ? `${legendId}-error` : undefined;
  return (
    <li
      className={`rounded-lg border px-4 py-3 ${answer === 'yes' ? 'border-alarm-700 bg-alarm-50' : 'border-paper-200 bg-white'}`}
    >
      <fieldset aria-describedby={[`${legendId}-severity`, errorId].filter(Boolean).join(' ')}>
        <legend id={legendId} className="font-medium text-paper-950">
          <span className="mr-1.5 text-paper-600">{number}.</span>
          {question.question}
        </legend>
        <p id={`${legendId}-severity`} className="mt-0.5 text-sm text-paper-700">
          {severityWords[question.severity]}.
        </p>
        <div className="mt-2 flex flex-wrap gap-2">
          {(['no', 'yes'] as const).map((value) => (
            <label
              key={value}
              className="flex min-h-tap min-w-24 cursor-pointer items-center gap-2 rounded-lg border border-paper-400 bg-white px-3 py-1.5 font-medium has-[:checked]:border-2 has-[:checked]:border-iris-700"
            >
              <input
                type="radio"
                value={value}
                className="size-5 accent-iris-700"
                aria-invalid={answerError ? true : undefined}
                {...register(`checklist.${question.id}.answer`)}
              />
              {value === 'yes' ? 'Yes' : 'No'}
            </label>
          ))}
        </div>
        <FieldError id={errorId} message={answerError} />
      </fieldset>
      {answer === 'yes' && question.severity === 'absolute' && (
        <p
          role="alert"
          className="mt-3 rounded-lg border-2 border-alarm-700 bg-white px-3 py-2 font-semibold text-alarm-800"
        >
          This order cannot be signed: “{question.question}” is an absolute contraindication in this
          protocol version. No reason unlocks it; if the answer is wrong, correct it.
        </p>
      )}
      {answer === 'yes' && question.severity === 'caution' && (
        <TextAreaField
          className="mt-3"
          label="Reason to go on despite the yes (required)"
          hint={`At least ${minimumSubstantialReasonChars} characters and ${minimumSubstantialReasonWords} words saying why treatment is still right — not the question again, not “n/a” or “ok”. It is shown as a banner on every later screen.`}
          error={reasonError}
          {...register(`checklist.${question.id}.overrideReason`)}
        />
      )}
    </li>
  );
}

/** The protocol version's contraindication questions, each answered yes or no. */
export function ContraindicationChecklist(props: ChecklistProps) {
  const { questions } = props;
  const answers = useWatch({ control: props.control, name: 'checklist' }) ?? {};
  const answered = questions.filter(
    (q) => answers[q.id]?.answer === 'yes' || answers[q.id]?.answer === 'no',
  ).length;
  if (questions.length === 0) {
    return (
      <p className="text-paper-700">This protocol version has no contraindication questions.</p>
    );
  }
  return (
    <div className="space-y-3">
      <p className="text-sm text-paper-700" aria-live="polite">
        {answered} of {questions.length} answered. Every question needs an answer before the order
        can be signed; a draft can be saved with some left open.
      </p>
      <ol className="space-y-3">
        {questions.map((question, index) => (
          <QuestionBlock key={question.id} question={question} number={index + 1} {...props} />
        ))}
      </ol>
    </div>
  );
}
