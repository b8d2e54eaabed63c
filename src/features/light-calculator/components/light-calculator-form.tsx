import { zodResolver } from '@hookform/resolvers/zod';
import { useEffect } from 'react';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import {
  lightCalculationRequestSchema,
  type LightCalculationRequest,
  type LightSolution,
} from '../../../../shared/schemas/calculation';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { TextField } from '../../../components/ui/text-field';
import { describeError, isApiRequestError } from '../../../lib/api-client';
import { applyServerFieldErrors } from '../../../lib/form-errors';
import { parseTypedNumber } from '../../../lib/typed-number';
import { useLightCalculation } from '../hooks/use-light-calculation';
import { lightFieldOrder, messageInWords, quantityText, type LightField } from './light-fields';

/**
 * The form holds text; an empty field means "work this out". Text is read as the order form
 * reads it (a decimal comma is accepted: src/lib/typed-number), then checked by the same schema
 * the server uses, so the rule and its wording live in one place. Unreadable text becomes NaN,
 * which that schema refuses naming the field.
 */
const numberText = z
  .string()
  .transform((text) => {
    const parsed = parseTypedNumber(text);
    return parsed === 'invalid' ? Number.NaN : parsed;
  })
  .optional();

const lightFormSchema = z
  .object({
    powerMw: numberText,
    spotDiameterUm: numberText,
    irradianceMwPerCm2: numberText,
    exposureS: numberText,
    fluenceJPerCm2: numberText,
    energyJ: numberText,
  })
  .pipe(lightCalculationRequestSchema);

type LightFormInput = z.input<typeof lightFormSchema>;

const emptyForm: LightFormInput = {
  powerMw: '',
  spotDiameterUm: '',
  irradianceMwPerCm2: '',
  exposureS: '',
  fluenceJPerCm2: '',
  energyJ: '',
};

type LightCalculatorFormProps = {
  onSolved: (solution: LightSolution, request: LightCalculationRequest) => void;
  onCleared: () => void;
};

export function LightCalculatorForm({ onSolved, onCleared }: LightCalculatorFormProps) {
  const calculation = useLightCalculation();
  const {
    register,
    handleSubmit,
    setError,
    reset,
    watch,
    formState: { errors },
  } = useForm<LightFormInput, unknown, LightCalculationRequest>({
    resolver: zodResolver(lightFormSchema),
    defaultValues: emptyForm,
  });

  // A result on screen must always belong to the figures on screen: any edit takes it away.
  const resetCalculation = calculation.reset;
  useEffect(() => {
    const subscription = watch((_values, { type }) => {
      if (type !== 'change') return;
      // An answer still on its way was asked for with the old figures; it must not arrive either.
      resetCalculation();
      onCleared();
    });
    return () => subscription.unsubscribe();
  }, [watch, onCleared, resetCalculation]);

  const onSubmit = handleSubmit((request) => {
    calculation.mutate(request, {
      onSuccess: (solution) => onSolved(solution, request),
      onError: (error) => {
        if (isApiRequestError(error) && error.status === 400)
          applyServerFieldErrors(error, setError, lightFieldOrder);
      },
    });
  });

  const error = calculation.error;
  const atFields =
    isApiRequestError(error) &&
    error.status === 400 &&
    error.fields.some((f) => (lightFieldOrder as readonly string[]).includes(f.path));

  return (
    <form
      onSubmit={onSubmit}
      noValidate
      aria-labelledby="light-form-heading"
      className="rounded-2xl border border-paper-200 bg-white p-6"
    >
      <h2 id="light-form-heading" className="text-xl font-semibold text-paper-950">
        Your figures
      </h2>
      <p className="mt-1 mb-5 max-w-prose text-paper-700">
        Fill in what you know and leave the rest empty. Two figures answer what they fix together —
        spot diameter and irradiance give the power; fluence and irradiance give the time — and
        three that do not depend on each other give all six. A further figure is checked against the
        others. A decimal comma or point both work (42,4 or 42.4).
      </p>
      {error && (
        <Alert
          tone="error"
          title={atFields ? 'Not calculated: see the fields marked below' : 'Not calculated'}
          className="mb-5"
        >
          {!atFields && describeError(error)}
        </Alert>
      )}
      <div className="grid gap-x-5 gap-y-4 sm:grid-cols-2 lg:grid-cols-3">
        {lightFieldOrder.map((field: LightField) => {
          const { label, unit } = quantityText[field];
          return (
            <TextField
              key={field}
              label={`${label} (${unit})`}
              hint={`A number above 0 ${unit}, or empty`}
              inputMode="decimal"
              autoComplete="off"
              spellCheck={false}
              error={messageInWords(errors[field]?.message)}
              {...register(field)}
            />
          );
        })}
      </div>
      <div className="mt-6 flex flex-wrap gap-3">
        <Button type="submit" busy={calculation.isPending}>
          {calculation.isPending ? 'Calculating…' : 'Calculate'}
        </Button>
        <Button
          variant="secondary"
          disabled={calculation.isPending}
          onClick={() => {
            reset(emptyForm);
            calculation.reset();
            onCleared();
          }}
        >
          Clear all
        </Button>
      </div>
    </form>
  );
}
