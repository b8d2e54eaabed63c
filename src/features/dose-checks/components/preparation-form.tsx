import { useServerNowMs } from '../../../lib/server-now';
import { zodResolver } from '@hookform/resolvers/zod';
import { withoutSourceMarks } from '../../../../shared/protocol/source-marks';
import { DateTime } from 'luxon';
import { useQuery } from '@tanstack/react-query';
import { useForm } from 'react-hook-form';
import { stockLotsQuery } from '../../../lib/queries/stock';
import { SelectField } from '../../../components/ui/select-field';
import { KeptDraftOffer } from '../../../components/ui/kept-draft-offer';
import { overDefaults, useFormDraft } from '../../../lib/form-draft';
import { z } from 'zod';
import type { DosePlan } from '../../../../shared/schemas/calculation';
import type { OrderDetail, PreparationEntry } from '../../../../shared/schemas/orders';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { ClockIcon } from '../../../components/ui/icons';
import { TextField } from '../../../components/ui/text-field';
import { unitTimeZone, unitTimeZoneLabel } from '../../../config/unit-time-zone';
import { describeError, isApiRequestError } from '../../../lib/api-client';
import {
  applyServerFieldErrors,
  readableMessage,
  unplacedFieldProblems,
} from '../../../lib/form-errors';
import type { ProtocolDrugParameters } from '../api/get-protocol-drug';
import { useRecordPreparation } from '../hooks/use-record-preparation';
import { quantity } from './display-format';
import { parseUnitDate, unitDatePattern } from '../../../lib/unit-times';

const localMinuteFormat = "yyyy-LL-dd'T'HH:mm";

/*
 * The form checks only the shape of what is typed. Whether the vial is in date, the time not in
 * the future and the volume close enough to the plan is the server's rule; its answer is shown
 * beside the field, naming the allowed range.
 */
const preparationFormSchema = z.object({
  /** A stock lot's id, or '' for the lot that expires first (or for a lot typed below). */
  stockLotId: z
    .string()
    .transform((v) => (v === '' ? undefined : Number(v)))
    .optional(),
  vialLot: z
    .string()
    .trim()
    .regex(
      /^([A-Za-z0-9][A-Za-z0-9 ./-]{1,39})?$/,
      'Vial lot must be 2 to 40 letters, digits, spaces, dots, slashes or hyphens, starting with a letter or digit',
    )
    .transform((v) => (v === '' ? undefined : v)),
  vialExpiry: z
    .union([
      z.literal('').transform(() => undefined),
      z.iso.date({ error: 'Enter the expiry date printed on the vial (today or later)' }),
    ])
    .optional(),
  reconstitutedAt: z
    .string()
    .trim()
    .min(
      1,
      `Enter when the powder was reconstituted (${unitTimeZoneLabel}); it cannot be in the future`,
    )
    .transform((text, ctx) => {
      const at = DateTime.fromISO(text, { zone: unitTimeZone });
      if (!at.isValid) {
        ctx.addIssue({
          code: 'custom',
          message: 'Reconstitution time must be a date and a time of day',
        });
        return z.NEVER;
      }
      return at.toISO({ suppressMilliseconds: true })!;
    }),
  volumeDrawnMl: z
    .string()
    .trim()
    .min(1, 'Enter the volume drawn in mL: a number greater than 0 and at most 100')
    .transform((text) => Number(text.replace(',', '.')))
    .pipe(
      z
        .number({ error: 'Volume drawn must be a number greater than 0 and at most 100 mL' })
        .positive('Volume drawn must be a number greater than 0 and at most 100 mL')
        .max(100, 'Volume drawn must be a number greater than 0 and at most 100 mL'),
    ),
});
type PreparationFormInput = z.input<typeof preparationFormSchema>;

const fieldNames = [
  'stockLotId',
  'vialLot',
  'vialExpiry',
  'reconstitutedAt',
  'volumeDrawnMl',
] as const;
// Field names come from the shared table (shared/format/field-labels.ts).
const labels = {};

type PreparationFormProps = {
  order: OrderDetail;
  plan: DosePlan;
  protocol: ProtocolDrugParameters | undefined;
  /** Server clock minus this device's clock, in ms. */
  clockOffsetMs: number;
};

export function PreparationForm({ order, plan, protocol, clockOffsetMs }: PreparationFormProps) {
  const record = useRecordPreparation();
  // The server's time, read each second for what is shown; a press reads the clock again.
  const serverNowMs = useServerNowMs(clockOffsetMs);
  const serverTime = (atMs: number) => DateTime.fromMillis(atMs, { zone: unitTimeZone });
  const nowText = (atMs: number) => serverTime(atMs).toFormat(localMinuteFormat);
  const {
    register,
    handleSubmit,
    setError,
    setValue,
    watch,
    reset,
    getValues,
    formState: { errors },
  } = useForm<PreparationFormInput, unknown, PreparationEntry>({
    resolver: zodResolver(preparationFormSchema),
    defaultValues: {
      stockLotId: '',
      vialLot: '',
      vialExpiry: '',
      reconstitutedAt: nowText(serverNowMs),
      volumeDrawnMl: '',
    },
  });
  const draftKeeper = useFormDraft(
    `preparation.${order.id}`,
    { watch, reset, getValues },
    {
      settle: overDefaults({
        stockLotId: '',
        vialLot: '',
        vialExpiry: '',
        reconstitutedAt: '',
        volumeDrawnMl: '',
      }),
    },
  );

  const onSubmit = handleSubmit((typed) => {
    // A typed lot is the pharmacist's choice; otherwise the lot picked from stock (or, left on
    // the first option, the lot that expires first: the server picks it).
    const entry: PreparationEntry = typed.vialLot
      ? { ...typed, stockLotId: undefined }
      : { ...typed, vialLot: undefined, vialExpiry: undefined };
    record.mutate(
      { orderId: order.id, entry },
      {
        onSuccess: draftKeeper.clear,
        onError: (error) => {
          if (isApiRequestError(error) && error.status === 400)
            applyServerFieldErrors(error, setError, fieldNames);
        },
      },
    );
  });

  const drug = protocol?.definition.drug ?? null;
  const lots = useQuery(stockLotsQuery());
  const usable = (lots.data?.lots ?? []).filter(
    (l) => l.product === 'verteporfin' && !l.expired && l.quantityOnHand >= (plan.vials ?? 1),
  );
  const pct = protocol?.definition.tolerances.drugVolumePct ?? null;
  const planned = plan.drugVolumeMl;
  const range =
    planned !== null && pct !== null
      ? `from ${quantity(+(planned * (1 - pct / 100)).toFixed(2), 'mL')} to ${quantity(+(planned * (1 + pct / 100)).toFixed(2), 'mL')} (plan ± ${quantity(pct, '%')})`
      : null;

  const error = record.error;
  const atFields =
    isApiRequestError(error) &&
    error.status === 400 &&
    error.fields.some((f) => (fieldNames as readonly string[]).includes(f.path));
  const unplaced = isApiRequestError(error) ? unplacedFieldProblems(error, fieldNames) : [];

  return (
    <form
      onSubmit={onSubmit}
      noValidate
      aria-labelledby="preparation-heading"
      className="rounded-2xl border-2 border-iris-300 bg-white p-6"
    >
      <h2 id="preparation-heading" className="text-xl font-semibold text-paper-950">
        Record the preparation
      </h2>
      <KeptDraftOffer draft={draftKeeper} what="preparation" />

      <div className="mt-3 mb-5 rounded-lg bg-paper-100 px-4 py-3 text-paper-900">
        <h3 className="font-semibold">What to prepare</h3>
        <ol className="numerals-steady mt-1 list-decimal space-y-0.5 pl-5">
          {drug && (
            <li>
              Reconstitute {quantity(plan.vials, plan.vials === 1 ? 'vial' : 'vials')} of{' '}
              {quantity(drug.vialContentMg, 'mg')} with{' '}
              {quantity(drug.reconstitutionVolumeMl, 'mL')} {drug.reconstitutionFluid} each (
              {quantity(drug.concentrationMgPerMl, 'mg/mL')}).
            </li>
          )}
          <li>
            Draw <strong>{quantity(plan.drugVolumeMl, 'mL')}</strong> ({quantity(plan.doseMg, 'mg')}
            ).
          </li>
          <li>
            Add {quantity(plan.diluentVolumeMl, 'mL')}{' '}
            {drug ? withoutSourceMarks(drug.diluent) : 'diluent'}
            {drug ? ` to make ${quantity(drug.finalVolumeMl, 'mL')}` : ''}; infuse at{' '}
            {quantity(plan.infusionRateMlPerMin, 'mL/min')}.
          </li>
        </ol>
      </div>

      {error && (
        <Alert
          tone="error"
          title={atFields ? 'Not recorded: see the fields marked below' : 'Not recorded'}
          className="mb-5"
        >
          {!atFields && <p>{describeError(error)}</p>}
          {atFields && <p>{error.message}</p>}
          {unplaced.length > 0 && (
            <ul className="list-disc pl-5">
              {unplaced.map((problem) => (
                <li key={problem}>{readableMessage(problem, labels)}</li>
              ))}
            </ul>
          )}
        </Alert>
      )}

      <div className="grid gap-5 sm:grid-cols-2">
        <SelectField
          label="Lot from stock"
          hint="First-expiry-first unless you pick another; expired and empty lots are not offered."
          className="sm:col-span-2"
          error={readableMessage(errors.stockLotId?.message, labels)}
          {...register('stockLotId')}
        >
          <option value="">
            {usable.length > 0
              ? `The lot that expires first (${usable[0]!.lot}, expires ${usable[0]!.expiry})`
              : 'No lot in stock holds enough: type the lot below'}
          </option>
          {usable.map((l) => (
            <option key={l.id} value={l.id}>
              Lot {l.lot}, expires {l.expiry}, {l.quantityOnHand} on hand
            </option>
          ))}
        </SelectField>
        <TextField
          label="Vial lot"
          hint="Only for a lot typed by hand: as printed on the vial."
          autoComplete="off"
          spellCheck={false}
          error={readableMessage(errors.vialLot?.message, labels)}
          {...register('vialLot')}
        />
        <TextField
          label="Vial expiry"
          placeholder={unitDatePattern()}
          inputMode="numeric"
          autoComplete="off"
          hint={`Only with a typed lot: ${unitDatePattern()}, today or later.`}
          error={readableMessage(errors.vialExpiry?.message, labels)}
          {...register('vialExpiry', {
            // Typed in the unit's order; sent as YYYY-MM-DD (unreadable text goes on for the schema to refuse).
            setValueAs: (text: string) => parseUnitDate(text) ?? text,
          })}
        />
        <div className="flex flex-col gap-2">
          <TextField
            label="Reconstituted at"
            type="datetime-local"
            hint={`${unitTimeZoneLabel} (${unitTimeZone}). Not in the future${drug ? `, nor more than ${quantity(drug.beyondUseH, 'h')} ago` : ''}.`}
            error={readableMessage(errors.reconstitutedAt?.message, labels)}
            {...register('reconstitutedAt')}
          />
          <Button
            variant="secondary"
            size="sm"
            className="self-start"
            icon={<ClockIcon className="size-4" />}
            onClick={() =>
              setValue('reconstitutedAt', nowText(Date.now() + clockOffsetMs), {
                shouldDirty: true,
              })
            }
          >
            Set to now
          </Button>
        </div>
        <TextField
          label="Volume drawn (mL)"
          inputMode="decimal"
          autoComplete="off"
          hint={
            range
              ? `Plan ${quantity(planned, 'mL')}; allowed ${range}.`
              : `Plan ${quantity(planned, 'mL')}.`
          }
          className="numerals-steady"
          error={readableMessage(errors.volumeDrawnMl?.message, labels)}
          {...register('volumeDrawnMl')}
        />
      </div>
      <div className="mt-6">
        <Button type="submit" busy={record.isPending}>
          {record.isPending ? 'Recording…' : 'Record preparation'}
        </Button>
      </div>
    </form>
  );
}
