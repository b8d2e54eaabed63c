import { useQuery } from '@tanstack/react-query';
import { useCallback, useEffect, useLayoutEffect, useMemo, useRef, useState } from 'react';
import { Controller, useForm, useWatch, type Resolver } from 'react-hook-form';
import { bsaFormulaNames, bsaFormulas } from '../../../../shared/engine/bsa';
import { weightChangeMessage } from '../../../../shared/orders/weight-change';
import type { InputLimit } from '../../../../shared/protocol/protocol-schema';
import type { AmendOrder, OrderDetail, OrderDraft } from '../../../../shared/schemas/orders';
import { Alert } from '../../../components/ui/alert';
import { KeptDraftOffer } from '../../../components/ui/kept-draft-offer';
import { Link } from 'react-router-dom';
import { Button, LinkButton } from '../../../components/ui/button';
import { FieldError } from '../../../components/ui/text-field';
import { describeError, isApiRequestError } from '../../../lib/api-client';
import { useFormDraft } from '../../../lib/form-draft';
import { readableMessage } from '../../../lib/form-errors';
import { lensesQuery } from '../../../lib/queries/devices';
import { orderQueries } from '../api/order-queries';
import type { ProtocolChoices } from '../api/order-response-schemas';
import { usePlanPreview } from '../hooks/use-plan-preview';
import { useLastMeasurements } from '../hooks/use-last-measurements';
import { useSaveOrder } from '../hooks/use-save-order';
import { useSigningFacts } from '../hooks/use-signing-facts';
import { ContraindicationChecklist } from './contraindication-checklist';
import {
  checkOrderForm,
  formFieldFor,
  formToInputs,
  formReadiness,
  orderFormResolver,
  parseProtocolRef,
  protocolRefOf,
  reasonKey,
  settleFormValues,
  type OrderFormContext,
  type OrderFormMode,
  type OrderFormValues,
} from './order-form-values';
import { fieldWords } from './order-words';
import { LastMeasurements } from './last-measurements';
import { MeasureField } from './measure-field';
import { PatientPicker } from './patient-picker';
import { PlanPreviewPanel } from './plan-preview-panel';
import { formatFigure } from './plan-numbers';
import { SelectField } from '../../../components/ui/select-field';
import { TextAreaField } from '../../../components/ui/text-area-field';
import { paths } from '../../../config/paths';
import { Checkbox } from '../../../components/ui/checkbox';
import { TreatmentCautions } from './treatment-cautions';
import { formatUnitDate } from '../../../lib/unit-times';
import { orderStatusWords } from '../../../components/ui/order-status-words';
import {
  minimumSubstantialReasonChars,
  minimumSubstantialReasonWords,
} from '../../../../shared/orders/reason-of-substance';

type OrderFormProps = {
  mode: OrderFormMode;
  initialValues: OrderFormValues;
  /** The order being edited or amended. */
  source?: OrderDetail;
  protocolChoices: ProtocolChoices;
  cancelHref: string;
  onSaved: (order: OrderDetail) => void;
};

const read = (message: string | undefined) => readableMessage(message);
const sentence = (message: string) => message.charAt(0).toUpperCase() + message.slice(1);

function rangeHint(
  limit: InputLimit | null | undefined,
  unit: string,
  other?: { unit: string; per: number },
): string | undefined {
  if (!limit) return undefined;
  const { hard, soft } = limit;
  const unitText = unit ? ` ${unit}` : '';
  const inOther = other
    ? ` (${formatFigure(Number((hard.min / other.per).toFixed(1)))}–${formatFigure(Number((hard.max / other.per).toFixed(1)))} ${other.unit})`
    : '';
  return `Allowed ${formatFigure(hard.min)}–${formatFigure(hard.max)}${unitText}${inOther}; usual ${formatFigure(soft.min)}–${formatFigure(soft.max)}${unitText}`;
}

function Section({
  id,
  title,
  lead,
  children,
}: {
  id: string;
  title: string;
  lead?: string;
  children: React.ReactNode;
}) {
  return (
    <section
      aria-labelledby={`${id}-heading`}
      className="space-y-4 rounded-2xl border border-paper-200 bg-white p-5"
    >
      <div>
        <h2 id={`${id}-heading`} className="text-xl font-semibold text-paper-950">
          {title}
        </h2>
        {lead && <p className="mt-1 text-sm text-paper-700">{lead}</p>}
      </div>
      {children}
    </section>
  );
}

/** A protocol's newest approved version: the one a new order takes unless a reason says otherwise. */
function newestApproved<V extends { status: string; version: number }>(versions: readonly V[]) {
  return versions
    .filter((v) => v.status === 'approved')
    .reduce<V | undefined>((best, v) => (best && best.version >= v.version ? best : v), undefined);
}

export function OrderForm({
  mode,
  initialValues,
  source,
  protocolChoices,
  cancelHref,
  onSaved,
}: OrderFormProps) {
  const save = useSaveOrder();
  // The resolver reads the protocol and warnings as they are now, not as they were at mount: they
  // are worked out below from the values, after the form exists, and kept here once rendered.
  const contextRef = useRef<OrderFormContext>({
    mode,
    definition: null,
    warnedFields: null,
    openOrders: [],
  });
  const resolver = useCallback<Resolver<OrderFormValues, OrderFormContext>>(
    (formValues, _context, options) => orderFormResolver(formValues, contextRef.current, options),
    [],
  );
  const {
    register,
    control,
    handleSubmit,
    setError,
    setValue,
    getValues,
    trigger,
    watch,
    reset,
    formState: { errors, isSubmitted },
  } = useForm<OrderFormValues, OrderFormContext>({
    defaultValues: initialValues,
    resolver,
    reValidateMode: 'onChange',
    shouldFocusError: true,
  });

  const values = settleFormValues(useWatch({ control }));
  // The version of the order this form was filled from, sent with the save: a refetch in the
  // background must not make an older form look current, and a restored draft keeps its own.
  const [readVersion, setReadVersion] = useState(source?.version ?? 0);
  const draftKeeper = useFormDraft(
    `order.${mode}.${source?.id ?? 'new'}`,
    { watch, reset, getValues },
    {
      settle: settleFormValues,
      basis: readVersion,
      onRestore: (basis) => typeof basis === 'number' && basis > 0 && setReadVersion(basis),
    },
  );
  const chosenRef = parseProtocolRef(values.protocolRef);
  const definitionQuery = useQuery({
    ...orderQueries.protocolDefinition(chosenRef?.key ?? '', chosenRef?.version ?? 0),
    enabled: chosenRef !== null,
  });
  const definition = chosenRef ? (definitionQuery.data?.definition ?? null) : null;
  const kind = definition?.kind ?? null;
  // Lenses matter only to a laser treatment: asked for once a PDT protocol is chosen.
  const lenses = useQuery({ ...lensesQuery(), enabled: kind === 'pdt' });

  // A new protocol brings its own default BSA formula, unless the clinician chose another.
  const lastDefault = useRef<string | null>(null);
  useEffect(() => {
    if (!definition) return;
    const current = getValues('bsaFormula');
    if (current === '' || current === lastDefault.current)
      setValue('bsaFormula', definition.bsaFormulaDefault);
    lastDefault.current = definition.bsaFormulaDefault;
  }, [definition, getValues, setValue]);

  // A save tried while the version was still loading is checked again once it has arrived.
  useEffect(() => {
    if (definition && isSubmitted) void trigger('protocolRef');
  }, [definition, isSubmitted, trigger]);

  const { inputs } = formToInputs(values, kind);
  const preview = usePlanPreview(definition, inputs);
  const last = useLastMeasurements(
    /^\d+$/.test(values.patientId) ? Number(values.patientId) : null,
    inputs.weight,
    [source?.id, source?.previousRevisionId],
  );

  const patientIdChosen = /^\d+$/.test(values.patientId) ? Number(values.patientId) : null;
  const facts = useSigningFacts(patientIdChosen, values.eye, chosenRef, source?.id);
  const retreatmentMessage =
    facts && facts.recentTreatmentDays !== null && definition
      ? `This eye had the same kind of treatment ${facts.recentTreatmentDays} days ago; the protocol's minimum interval is ${definition.retreatmentMinDays} days.`
      : null;
  const openOrders = useMemo(() => facts?.openOrders ?? [], [facts]);
  const softLimitWarnings = useMemo(() => {
    const from =
      preview.state === 'ready'
        ? preview.plan.warnings
        : preview.state === 'refused'
          ? []
          : (source?.warnings ?? []);
    return from.filter(
      (w): w is typeof w & { field: string } =>
        w.code === 'soft-limit' && typeof w.field === 'string',
    );
  }, [preview, source]);

  const chosenChoice = chosenRef
    ? protocolChoices
        .flatMap((p) => p.versions)
        .find((v) => v.key === chosenRef.key && v.version === chosenRef.version)
    : undefined;
  const supersededBy = chosenChoice?.supersededBy ?? null;
  const warnedFields = useMemo(
    () => (preview.state === 'ready' || source ? softLimitWarnings.map((w) => w.field) : null),
    [preview.state, source, softLimitWarnings],
  );
  const formContext = useMemo<OrderFormContext>(
    () => ({ mode, definition, warnedFields, supersededBy, openOrders }),
    [mode, definition, warnedFields, supersededBy, openOrders],
  );
  useLayoutEffect(() => {
    contextRef.current = formContext;
  }, [formContext]);

  // Problems the engine finds with what is typed: beside the field when something is typed there,
  // otherwise in the preview's list of what is still needed.
  const typedIn = (field: string | null) =>
    field !== null &&
    field in values &&
    String(values[field as keyof OrderFormValues] ?? '').trim() !== '';
  const engineProblems = preview.state === 'refused' ? preview.problems : [];
  const besideField = new Map<string, string>();
  const missing = engineProblems.filter((p) => {
    const field = formFieldFor(p.path);
    if (typedIn(field)) {
      if (!besideField.has(field!)) besideField.set(field!, sentence(p.message));
      return false;
    }
    return true;
  });
  const fieldError = (name: keyof OrderFormValues) =>
    read(errors[name]?.message as string | undefined) ?? besideField.get(name);

  const thinStroma = preview.state === 'ready' && preview.plan.thicknessOk === false;

  // The same function the server signs by, fed with the server's facts about this patient.
  const readiness = useMemo(() => {
    if (!definition || preview.state !== 'ready' || !facts) return null;
    return formReadiness(values, formContext, preview.plan, {
      weightChange: last.weightChange,
      facts,
    });
  }, [definition, formContext, preview, values, facts, last.weightChange]);

  const onSubmit = handleSubmit((formValues) => {
    const { draft } = checkOrderForm(formValues, formContext);
    const request =
      mode === 'new'
        ? { mode, draft: draft as OrderDraft }
        : mode === 'edit'
          ? { mode, id: source!.id, version: readVersion, draft: draft as OrderDraft }
          : { mode, id: source!.id, version: readVersion, amendment: draft as AmendOrder };
    save.mutate(request, {
      onSuccess: (order) => {
        draftKeeper.clear();
        onSaved(order);
      },
      onError: (error) => {
        if (!isApiRequestError(error) || error.status !== 400) return;
        let focused = false;
        for (const problem of error.fields) {
          const field = formFieldFor(problem.path, draft);
          if (!field) continue;
          setError(
            field as keyof OrderFormValues,
            { type: 'server', message: sentence(problem.message) },
            { shouldFocus: !focused },
          );
          focused = true;
        }
      },
    });
  });

  const saveError = save.error;
  const unplacedServer = isApiRequestError(saveError)
    ? saveError.fields.filter((p) => formFieldFor(p.path) === null).map((p) => sentence(p.message))
    : [];
  const formLevelError = (errors.root as Record<string, { message?: string }> | undefined)?.form
    ?.message;
  const approved = protocolChoices.flatMap((p) =>
    p.versions.filter((v) => v.status === 'approved'),
  );
  // Older approved versions, listed apart from the newest of each protocol (newest first).
  const superseded = approved
    .filter((v) => v.supersededBy !== null)
    .sort((a, b) => a.title.localeCompare(b.title) || b.version - a.version);
  const currentNotApproved =
    chosenRef && !approved.some((v) => v.key === chosenRef.key && v.version === chosenRef.version);
  const limits = definition?.inputLimits;

  const saveLabel = mode === 'amend' ? 'Save the amendment as a draft' : 'Save draft';

  return (
    <div className="grid items-start gap-6 lg:grid-cols-[minmax(0,1fr)_22rem]">
      <form
        onSubmit={onSubmit}
        noValidate
        className="min-w-0 space-y-6"
        aria-label={mode === 'amend' ? 'Amendment' : 'Order'}
      >
        <KeptDraftOffer draft={draftKeeper} what={mode === 'amend' ? 'amendment' : 'order'} />
        {mode === 'amend' && (
          <Section
            id="amendment"
            title="Why this amendment"
            lead="The signed revision stays on record; this reason goes with the new revision."
          >
            <TextAreaField
              label="Reason for the amendment (required)"
              hint="5 to 500 characters"
              rows={3}
              error={fieldError('amendmentReason')}
              {...register('amendmentReason')}
            />
          </Section>
        )}

        <Section id="who" title="Patient and eye">
          <Controller
            control={control}
            name="patientId"
            render={({ field }) => (
              <PatientPicker
                ref={field.ref}
                value={field.value}
                onChange={field.onChange}
                locked={mode === 'amend'}
                error={fieldError('patientId')}
              />
            )}
          />
          <fieldset
            aria-describedby={fieldError('eye') ? 'eye-reminder eye-error' : 'eye-reminder'}
            className="space-y-2"
          >
            <legend className="font-medium text-paper-900">Treatment eye (required)</legend>
            <p id="eye-reminder" className="text-sm text-paper-700">
              Confirm the eye with the patient and against the notes and the consent form before
              choosing.
            </p>
            <div className="flex flex-wrap gap-3">
              {(['right', 'left'] as const).map((eye) => (
                <label
                  key={eye}
                  className="flex min-h-tap min-w-40 cursor-pointer items-center gap-3 rounded-lg border border-paper-400 bg-white px-4 py-2 text-lg font-semibold has-[:checked]:border-2 has-[:checked]:border-iris-700 has-[:checked]:bg-iris-50"
                >
                  <input
                    type="radio"
                    value={eye}
                    className="size-5 accent-iris-700"
                    aria-invalid={errors.eye ? true : undefined}
                    {...register('eye')}
                  />
                  {eye === 'right' ? 'Right eye' : 'Left eye'}
                </label>
              ))}
            </div>
            <FieldError id="eye-error" message={fieldError('eye')} />
          </fieldset>
        </Section>

        <Section id="protocol" title="Protocol">
          <SelectField
            label="Protocol version"
            hint="Approved versions only; the order keeps the exact version chosen."
            error={
              fieldError('protocolRef') ??
              (definitionQuery.isError ? describeError(definitionQuery.error) : undefined)
            }
            {...register('protocolRef')}
          >
            <option value="">Choose a protocol version…</option>
            {(['pdt', 'cxl'] as const).map((kind) => {
              // Each protocol offers its newest approved version: choosing the protocol chooses
              // that version by default. Older ones wait apart, each needing a reason.
              const newest = protocolChoices
                .filter((protocol) => protocol.kind === kind)
                .map((protocol) => newestApproved(protocol.versions))
                .filter((v) => v !== undefined);
              if (newest.length === 0) return null;
              return (
                <optgroup
                  key={kind}
                  label={kind === 'pdt' ? 'Photodynamic therapy' : 'Corneal cross-linking'}
                >
                  {newest.map((v) => (
                    <option key={`${v.key}-${v.version}`} value={protocolRefOf(v.key, v.version)}>
                      {v.title} — version {v.version}
                    </option>
                  ))}
                </optgroup>
              );
            })}
            {superseded.length > 0 && (
              <optgroup label="Superseded versions (each needs a reason)">
                {superseded.map((v) => (
                  <option key={`${v.key}-${v.version}`} value={protocolRefOf(v.key, v.version)}>
                    {v.title} — version {v.version} (superseded by version {v.supersededBy}; needs a
                    reason)
                  </option>
                ))}
              </optgroup>
            )}
            {currentNotApproved && (
              <option value={values.protocolRef}>
                {source?.protocol.title ?? chosenRef.key} — version {chosenRef.version} (no longer
                approved)
              </option>
            )}
          </SelectField>
          {definition && <p className="text-sm text-paper-700">{definition.summary}</p>}
          {chosenChoice && chosenChoice.supersededBy !== null && (
            <div className="space-y-3 rounded-lg border border-paper-400 bg-paper-50 px-4 py-3">
              <p className="text-paper-900">
                Version {chosenChoice.version} is superseded: version {chosenChoice.supersededBy} of
                this protocol is approved and is the one to use unless this patient needs the older
                one.
              </p>
              <div className="flex flex-wrap gap-3">
                <Button
                  variant="secondary"
                  size="sm"
                  onClick={() =>
                    setValue(
                      'protocolRef',
                      protocolRefOf(chosenChoice.key, chosenChoice.supersededBy!),
                      { shouldValidate: isSubmitted },
                    )
                  }
                >
                  Use version {chosenChoice.supersededBy} instead
                </Button>
                <Link
                  target="_blank"
                  rel="noreferrer"
                  className="self-center text-iris-700 underline underline-offset-4"
                  to={paths.protocolCompare.getHref(
                    chosenChoice.key,
                    chosenChoice.version,
                    chosenChoice.supersededBy,
                  )}
                >
                  What changed in version {chosenChoice.supersededBy} (opens in a new tab)
                </Link>
              </div>
              <TextAreaField
                label="Reason for using the superseded version (required)"
                hint="At least 15 characters and 3 words: why the older version is right for this patient. Kept with the order."
                rows={2}
                error={fieldError('supersededVersionReason')}
                {...register('supersededVersionReason')}
              />
            </div>
          )}
        </Section>

        <Section
          id="measurements"
          title="Measurements"
          lead={
            kind === 'cxl'
              ? 'Height and weight are optional for cross-linking; when given, the plan shows the BSA.'
              : 'Measured today where possible. Values outside the usual range need a reason.'
          }
        >
          <div className="grid gap-5 sm:grid-cols-2">
            <MeasureField
              label={kind === 'cxl' ? 'Height (optional)' : 'Height'}
              hint={rangeHint(limits?.heightCm, 'cm', { unit: 'in', per: 2.54 })}
              error={fieldError('heightValue')}
              value={register('heightValue')}
              unit={{ registration: register('heightUnit'), options: ['cm', 'in'] }}
            />
            <MeasureField
              label={kind === 'cxl' ? 'Weight (optional)' : 'Weight'}
              hint={rangeHint(limits?.weightKg, 'kg', { unit: 'lb', per: 0.45359237 })}
              error={fieldError('weightValue')}
              value={register('weightValue')}
              unit={{ registration: register('weightUnit'), options: ['kg', 'lb'] }}
            />
            <SelectField
              label="BSA formula"
              hint={
                definition
                  ? `The protocol’s default is ${bsaFormulas[definition.bsaFormulaDefault].label}.`
                  : 'The protocol’s default is chosen for you.'
              }
              error={fieldError('bsaFormula')}
              {...register('bsaFormula')}
            >
              <option value="">Protocol default</option>
              {bsaFormulaNames.map((name) => (
                <option key={name} value={name}>
                  {bsaFormulas[name].label}
                  {definition?.bsaFormulaDefault === name ? ' (protocol default)' : ''}
                </option>
              ))}
            </SelectField>
          </div>

          {/^\d+$/.test(values.patientId) && <LastMeasurements last={last} />}

          {kind === 'pdt' && (
            <div className="grid gap-5 sm:grid-cols-2">
              <MeasureField
                label="Lesion greatest linear dimension (GLD)"
                hint={rangeHint(limits?.lesionGldUm, 'µm')}
                error={fieldError('lesionGldUm')}
                value={register('lesionGldUm')}
                fixedUnit="µm"
              />
              <SelectField
                label="Contact lens"
                hint="From the lens register: its laser-spot factor fills the field beside (device spot = retinal spot ÷ factor)"
                value={values.lensId}
                onChange={(event) => {
                  const lens = lenses.data?.find((l) => String(l.id) === event.target.value);
                  setValue('lensId', event.target.value, { shouldDirty: true });
                  if (lens)
                    setValue('lensMagnification', String(lens.laserSpotFactor), {
                      shouldDirty: true,
                      shouldValidate: true,
                    });
                }}
              >
                <option value="">None picked: type the factor</option>
                {(lenses.data ?? []).map((l) => (
                  <option key={l.id} value={l.id}>
                    {l.name} — laser-spot factor × {l.laserSpotFactor} (image ×{' '}
                    {l.imageMagnification}, not for the spot)
                  </option>
                ))}
              </SelectField>
              <MeasureField
                label="Laser-spot magnification of the contact lens"
                hint={
                  rangeHint(limits?.lensMagnification, '') ?? 'The factor given for the lens in use'
                }
                error={fieldError('lensMagnification')}
                value={register('lensMagnification')}
                fixedUnit="×"
              />
            </div>
          )}
          {kind === 'cxl' && (
            <div className="grid gap-5 sm:grid-cols-2">
              <MeasureField
                label="Thinnest stromal thickness"
                hint={`${rangeHint(limits?.stromalThicknessUm, 'µm') ?? ''}${definition?.cxl ? `. The protocol’s minimum for UV is ${formatFigure(definition.cxl.minStromalThicknessUm)} µm.` : ''}`}
                error={fieldError('stromalThicknessUm')}
                value={register('stromalThicknessUm')}
                fixedUnit="µm"
              />
              {thinStroma && definition?.cxl && !definition.cxl.swellingAllowed && (
                <p
                  role="alert"
                  className="rounded-lg border-2 border-alarm-700 bg-alarm-50 px-3 py-2 font-semibold text-alarm-800 sm:col-span-2"
                >
                  Do not treat with this protocol: the stroma is below its minimum of{' '}
                  {formatFigure(definition.cxl.minStromalThicknessUm)} µm and it has no swelling
                  step. This order cannot be signed.
                </p>
              )}
              {definition?.cxl?.swellingAllowed && (thinStroma || values.swellingAcknowledged) && (
                <div className="rounded-lg border border-alarm-700 bg-alarm-50 p-3 sm:col-span-2">
                  <Checkbox
                    label="I acknowledge the stroma is below the minimum"
                    description={`The swelling step (${definition.cxl.swellingRiboflavin ?? 'hypo-osmolar riboflavin'}) must bring it to ${formatFigure(definition.cxl.minStromalThicknessUm)} µm, re-measured, before UV starts. Required before signing.`}
                    {...register('swellingAcknowledged')}
                  />
                  {fieldError('swellingAcknowledged') && (
                    <p className="mt-1 text-sm text-alarm-800">
                      {fieldError('swellingAcknowledged')}
                    </p>
                  )}
                </div>
              )}
            </div>
          )}
          {!kind && (
            <p className="text-sm text-paper-700">
              Choose a protocol version to see the measurements it needs.
            </p>
          )}
        </Section>

        {definition && (
          <Section
            id="checklist"
            title="Contraindication checklist"
            lead="Ask the patient and check the notes. Answer every question yes or no."
          >
            <ContraindicationChecklist
              questions={definition.contraindications}
              register={register}
              control={control}
              errors={errors}
              readMessage={read}
            />
          </Section>
        )}

        {(openOrders.length > 0 || values.duplicateOrderReason.trim() !== '') && (
          <Section
            id="duplicate"
            title="Another open order for this eye"
            lead="A second order for the same patient, eye and kind of treatment is usually a slip. Cancel or amend the other order, or say why both are right."
          >
            {openOrders.length > 0 && (
              <ul className="space-y-1 rounded-lg border border-alarm-700 bg-alarm-50 p-3 text-paper-900">
                {openOrders.map((o) => (
                  <li key={o.id}>
                    <Link
                      to={paths.order.getHref(o.id)}
                      className="font-medium text-iris-700 underline underline-offset-4"
                      target="_blank"
                    >
                      Order {o.id}
                    </Link>{' '}
                    — {o.protocolTitle}, {orderStatusWords(o.status)}, started{' '}
                    {formatUnitDate(o.createdAt)}
                  </li>
                ))}
              </ul>
            )}
            <TextAreaField
              label="Reason for a second open order (required)"
              hint={`At least ${minimumSubstantialReasonChars} characters and ${minimumSubstantialReasonWords} words: why both orders are right`}
              rows={2}
              error={fieldError('duplicateOrderReason')}
              {...register('duplicateOrderReason')}
            />
          </Section>
        )}

        {(softLimitWarnings.length > 0 ||
          retreatmentMessage ||
          values.retreatmentReason.trim() !== '' ||
          last.weightChange ||
          values.weightChangeReason.trim() !== '') && (
          <Section
            id="reasons"
            title="Reasons to go on"
            lead="Each warning below needs a reason before the order can be signed."
          >
            {softLimitWarnings.map((warning) => (
              <div
                key={warning.field}
                className="space-y-2 rounded-lg border border-alarm-700 bg-alarm-50 p-3"
              >
                <p className="text-sm text-paper-900">{sentence(warning.message)}</p>
                <TextAreaField
                  label={`Reason for the ${fieldWords[warning.field] ?? warning.field} outside the usual range`}
                  hint="5 to 500 characters, e.g. how it was re-measured"
                  error={read(
                    (
                      errors.softLimitReasons?.[reasonKey(warning.field)] as
                        { message?: string } | undefined
                    )?.message,
                  )}
                  {...register(`softLimitReasons.${reasonKey(warning.field)}`)}
                />
              </div>
            ))}
            {(retreatmentMessage || values.retreatmentReason.trim() !== '') && (
              <div className="space-y-2 rounded-lg border border-alarm-700 bg-alarm-50 p-3">
                {retreatmentMessage && (
                  <p className="text-sm text-paper-900">{retreatmentMessage}</p>
                )}
                <TextAreaField
                  label="Reason to treat again within the minimum interval"
                  hint="5 to 500 characters"
                  error={fieldError('retreatmentReason')}
                  {...register('retreatmentReason')}
                />
              </div>
            )}
            {(last.weightChange || values.weightChangeReason.trim() !== '') && (
              <div className="space-y-2 rounded-lg border border-alarm-700 bg-alarm-50 p-3">
                {last.weightChange && (
                  <p className="text-sm text-paper-900">
                    {sentence(weightChangeMessage(last.weightChange))}.
                  </p>
                )}
                <TextAreaField
                  label="Reason for the change in weight since the last one recorded"
                  hint="5 to 500 characters, e.g. how and when the patient was weighed"
                  error={fieldError('weightChangeReason')}
                  {...register('weightChangeReason')}
                />
              </div>
            )}
          </Section>
        )}

        <Section id="note" title="Note">
          <TextAreaField
            label="Note for the team (optional)"
            hint="Up to 2000 characters"
            rows={3}
            error={fieldError('note')}
            {...register('note')}
          />
        </Section>

        {formLevelError && (
          <Alert tone="error" title="The draft was not saved">
            {formLevelError}
          </Alert>
        )}
        {isSubmitted && Object.keys(errors).length > 0 && !formLevelError && !save.isError && (
          <Alert tone="error" title="The draft was not saved: check the fields marked above" />
        )}
        {saveError && (
          <Alert
            tone="error"
            title={
              isApiRequestError(saveError) &&
              saveError.status === 400 &&
              saveError.fields.length > 0
                ? 'The draft was not saved: check the fields marked above'
                : 'The draft was not saved'
            }
          >
            {unplacedServer.length > 0 ? (
              <ul className="list-disc pl-5">
                {unplacedServer.map((m) => (
                  <li key={m}>{m}</li>
                ))}
              </ul>
            ) : isApiRequestError(saveError) &&
              saveError.status === 400 &&
              saveError.fields.length > 0 ? null : (
              describeError(saveError)
            )}
          </Alert>
        )}
        <div className="flex flex-wrap gap-3">
          <Button type="submit" busy={save.isPending}>
            {save.isPending ? 'Saving…' : saveLabel}
          </Button>
          <LinkButton to={cancelHref} variant="secondary" onClick={draftKeeper.clear}>
            Cancel
          </LinkButton>
        </div>
      </form>

      <div className="space-y-6">
        <PlanPreviewPanel
          preview={preview}
          inputs={inputs}
          protocolChosen={chosenRef !== null}
          missing={missing}
          signatureProblems={readiness}
        />
        <TreatmentCautions kind={kind} protocolCautions={definition?.cautions} />
      </div>
    </div>
  );
}
