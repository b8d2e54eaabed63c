import { zodResolver } from '@hookform/resolvers/zod';
import { useQuery } from '@tanstack/react-query';
import { useState } from 'react';
import { useForm, useWatch } from 'react-hook-form';
import { Link } from 'react-router-dom';
import {
  reasonOfSubstanceProblem,
  minimumSubstantialReasonChars,
  minimumSubstantialReasonWords,
} from '../../../../shared/orders/reason-of-substance';
import { TextAreaField } from '../../../components/ui/text-area-field';
import { paths } from '../../../config/paths';
import { fhirStatusQuery, type FhirCandidate } from '../api/fhir-patients';
import { patientQueries } from '../api/patient-queries';
import { FhirPatientSearch } from './fhir-patient-search';
import { useDebouncedValue } from '../hooks/use-debounced-value';
import { KeptDraftOffer } from '../../../components/ui/kept-draft-offer';
import { overDefaults, useFormDraft } from '../../../lib/form-draft';
import { z } from 'zod';
import {
  createPatientSchema,
  type CreatePatient,
  type Patient,
} from '../../../../shared/schemas/patients';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { Checkbox } from '../../../components/ui/checkbox';
import { FieldError, TextField } from '../../../components/ui/text-field';
import { describeError, isApiRequestError } from '../../../lib/api-client';
import {
  applyServerFieldErrors,
  readableMessage,
  unplacedFieldProblems,
} from '../../../lib/form-errors';
import { useCreatePatient } from '../hooks/use-create-patient';
import { formatCalendarDate, parseUnitDate, unitDatePattern } from '../../../lib/unit-times';

type PatientFormValues = {
  recordNumber: string;
  givenName: string;
  familyName: string;
  dateOfBirth: string;
  email: string;
  emailConsent: boolean;
  /** Another patient has this name and date of birth: this is a different person, and why. */
  duplicateConfirmed: boolean;
  duplicateReason: string;
};

// An empty e-mail box means "no address", which the API takes as null.
const patientFormSchema = z.preprocess((values) => {
  const v = values as PatientFormValues;
  return {
    ...v,
    email: (v.email ?? '').trim() === '' ? null : v.email,
    duplicateReason: (v.duplicateReason ?? '').trim() === '' ? null : v.duplicateReason,
  };
}, createPatientSchema) as unknown as z.ZodType<CreatePatient, PatientFormValues>;

// Field names come from the shared table (shared/format/field-labels.ts).
const labels = {};
const fieldNames = [
  'recordNumber',
  'givenName',
  'familyName',
  'dateOfBirth',
  'email',
  'emailConsent',
  'duplicateConfirmed',
  'duplicateReason',
] as const;

type AddPatientFormProps = {
  id: string;
  onCreated: (patient: Patient) => void;
  onCancel: () => void;
};

const patientDefaults: PatientFormValues = {
  recordNumber: '',
  givenName: '',
  familyName: '',
  dateOfBirth: '',
  email: '',
  emailConsent: false,
  duplicateConfirmed: false,
  duplicateReason: '',
};

const sameWhy = 'how you know this is another person';

export function AddPatientForm({ id, onCreated, onCancel }: AddPatientFormProps) {
  const createPatient = useCreatePatient();
  const fhirStatus = useQuery(fhirStatusQuery());
  /** The hospital record the form was filled from: sent along, and read again by the server. */
  const [fromFhir, setFromFhir] = useState<FhirCandidate | null>(null);
  const {
    setValue,
    register,
    handleSubmit,
    setError,
    watch,
    reset,
    getValues,
    control,
    formState: { errors },
  } = useForm<PatientFormValues, unknown, CreatePatient>({
    resolver: zodResolver(patientFormSchema),
    defaultValues: patientDefaults,
  });
  const draftKeeper = useFormDraft(
    'add-patient',
    { watch, reset, getValues },
    { settle: overDefaults(patientDefaults) },
  );

  // Who already has this name and date of birth, looked up as the three are typed.
  const [givenName, familyName, dateOfBirth] = useWatch({
    control,
    name: ['givenName', 'familyName', 'dateOfBirth'],
  });
  // Debounced as one string: a new object on every render would never settle.
  const typedKey = useDebouncedValue(
    JSON.stringify([givenName.trim(), familyName.trim(), dateOfBirth]),
    400,
  );
  const [typedGiven, typedFamily, typedBirth] = JSON.parse(typedKey) as [string, string, string];
  const typed = { givenName: typedGiven, familyName: typedFamily, dateOfBirth: typedBirth };
  const lookUp =
    typed.givenName !== '' &&
    typed.familyName !== '' &&
    /^\d{4}-\d{2}-\d{2}$/.test(typed.dateOfBirth);
  const duplicatesQuery = useQuery({
    ...patientQueries.possibleDuplicates(typed),
    enabled: lookUp,
  });
  const sameness = lookUp ? (duplicatesQuery.data ?? []) : [];

  const onSubmit = handleSubmit((input) => {
    // The server refuses a possible duplicate without confirmation and reason; ask first.
    if (sameness.length > 0) {
      if (!input.duplicateConfirmed) {
        setError(
          'duplicateConfirmed',
          {
            type: 'validate',
            message: 'Confirm that this is another person, or open the existing record',
          },
          { shouldFocus: true },
        );
        return;
      }
      const weak = reasonOfSubstanceProblem(input.duplicateReason, undefined, sameWhy);
      if (weak) {
        setError(
          'duplicateReason',
          { type: 'validate', message: weak.charAt(0).toUpperCase() + weak.slice(1) },
          { shouldFocus: true },
        );
        return;
      }
    }
    createPatient.mutate(fromFhir ? { ...input, fhirId: fromFhir.fhirId } : input, {
      onSuccess: (patient) => {
        draftKeeper.clear();
        onCreated(patient);
      },
      onError: (error) => {
        if (!isApiRequestError(error)) return;
        if (error.code === 'record_number_taken')
          setError(
            'recordNumber',
            { type: 'server', message: error.message },
            { shouldFocus: true },
          );
        if (error.status === 400 || error.code === 'possible_duplicate_patient')
          applyServerFieldErrors(error, setError, fieldNames);
      },
    });
  });

  const error = createPatient.error;
  const fieldLevel =
    isApiRequestError(error) &&
    (error.code === 'record_number_taken' ||
      error.code === 'possible_duplicate_patient' ||
      (error.status === 400 && error.fields.length > 0));
  const unplaced = isApiRequestError(error) ? unplacedFieldProblems(error, fieldNames) : [];

  return (
    <section
      id={id}
      aria-labelledby={`${id}-heading`}
      className="mb-8 rounded-2xl border border-paper-200 bg-white p-6"
    >
      <h2 id={`${id}-heading`} className="mb-1 text-xl font-semibold text-paper-950">
        Add a patient
      </h2>
      <KeptDraftOffer draft={draftKeeper} what="patient details" />
      <p className="mb-5 text-paper-700">
        Copy the record number and names exactly as they stand on the hospital record.
      </p>
      {fhirStatus.data?.enabled && (
        <FhirPatientSearch
          onPick={(c) => {
            const fill = { shouldDirty: true, shouldValidate: false } as const;
            setValue('recordNumber', c.recordNumber ?? '', fill);
            setValue('givenName', c.givenName, fill);
            setValue('familyName', c.familyName, fill);
            setValue('dateOfBirth', c.dateOfBirth ? formatCalendarDate(c.dateOfBirth) : '', fill);
            setFromFhir(c);
          }}
        />
      )}
      <form onSubmit={onSubmit} noValidate className="flex flex-col gap-5">
        {fromFhir && (
          <div className="flex flex-wrap items-center gap-3 rounded-lg border border-iris-700 bg-iris-50 px-4 py-3 text-paper-950">
            <p className="flex-1">
              Filled from the hospital record (FHIR Patient/{fromFhir.fhirId}). Check it against the
              patient in front of you; the record number must stay the hospital&apos;s.
            </p>
            <Button variant="secondary" onClick={() => setFromFhir(null)}>
              Do not link to the hospital record
            </Button>
          </div>
        )}
        {error &&
          (fieldLevel ? (
            <Alert tone="error" title="The patient was not added: check the fields marked below">
              {unplaced.length > 0 && (
                <ul className="list-disc pl-5">
                  {unplaced.map((problem) => (
                    <li key={problem}>{readableMessage(problem, labels)}</li>
                  ))}
                </ul>
              )}
            </Alert>
          ) : (
            <Alert tone="error" title="The patient was not added">
              {describeError(error)}
            </Alert>
          ))}
        <div className="grid gap-5 md:grid-cols-2">
          <TextField
            label="Record number"
            hint="3 to 20 letters, digits or hyphens, e.g. MP-100213"
            autoComplete="off"
            spellCheck={false}
            error={readableMessage(errors.recordNumber?.message, labels)}
            {...register('recordNumber')}
          />
          <TextField
            label="Date of birth"
            placeholder={unitDatePattern()}
            inputMode="numeric"
            autoComplete="off"
            hint={`${unitDatePattern()}, between 01/01/1900 and today`}
            error={readableMessage(errors.dateOfBirth?.message, labels)}
            {...register('dateOfBirth', {
              // Typed in the unit's order; sent as YYYY-MM-DD. Unreadable text goes on as typed,
              // for the schema to refuse.
              setValueAs: (text: string) => parseUnitDate(text) ?? text,
            })}
          />
          <TextField
            label="Given name"
            autoComplete="off"
            error={readableMessage(errors.givenName?.message, labels)}
            {...register('givenName')}
          />
          <TextField
            label="Family name"
            autoComplete="off"
            error={readableMessage(errors.familyName?.message, labels)}
            {...register('familyName')}
          />
          <TextField
            label="E-mail (optional)"
            type="email"
            inputMode="email"
            autoComplete="off"
            spellCheck={false}
            hint="Needed only when the patient agrees to receive the discharge sheet by e-mail"
            error={readableMessage(errors.email?.message, labels)}
            {...register('email')}
          />
          <div className="self-end">
            <Checkbox
              label="The patient agrees to receive e-mail from the unit"
              description="Discharge instructions and light-precaution times are then sent to the address above."
              {...register('emailConsent')}
            />
          </div>
        </div>
        {sameness.length > 0 && (
          <div
            role="alert"
            className="space-y-3 rounded-lg border-2 border-alarm-700 bg-alarm-50 p-4 text-paper-950"
          >
            <p className="font-semibold">
              Possible duplicate:{' '}
              {sameness.length === 1 ? 'a patient' : `${sameness.length} patients`} with this name
              and date of birth {sameness.length === 1 ? 'is' : 'are'} on record already.
            </p>
            <ul className="list-disc space-y-1 pl-5">
              {sameness.map((p) => (
                <li key={p.id}>
                  <Link
                    to={paths.patient.getHref(p.id)}
                    className="font-medium text-iris-700 underline underline-offset-4"
                  >
                    {p.familyName}, {p.givenName} · record {p.recordNumber}
                  </Link>{' '}
                  · born {formatCalendarDate(p.dateOfBirth)}
                </li>
              ))}
            </ul>
            <p className="text-sm text-paper-800">
              Open that record if it is the same person. Add a new one only for another person.
            </p>
            <Checkbox
              label="This is another person with the same name and date of birth"
              aria-invalid={errors.duplicateConfirmed ? true : undefined}
              {...register('duplicateConfirmed')}
            />
            <FieldError
              id={`${id}-duplicate-confirmed-error`}
              message={readableMessage(errors.duplicateConfirmed?.message, labels)}
            />
            <TextAreaField
              label="How you know it is another person (required)"
              hint={`At least ${minimumSubstantialReasonChars} characters and ${minimumSubstantialReasonWords} words, e.g. what was checked and with whom`}
              rows={2}
              error={readableMessage(errors.duplicateReason?.message, labels)}
              {...register('duplicateReason')}
            />
          </div>
        )}
        <div className="flex flex-wrap gap-3">
          <Button type="submit" busy={createPatient.isPending}>
            {createPatient.isPending ? 'Adding…' : 'Add patient'}
          </Button>
          <Button
            variant="secondary"
            onClick={() => {
              draftKeeper.clear();
              onCancel();
            }}
            disabled={createPatient.isPending}
          >
            Cancel
          </Button>
        </div>
      </form>
    </section>
  );
}
