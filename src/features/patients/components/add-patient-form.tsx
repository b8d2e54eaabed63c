import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
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
import { TextField } from '../../../components/ui/text-field';
import { describeError, isApiRequestError } from '../../../lib/api-client';
import {
  applyServerFieldErrors,
  readableMessage,
  unplacedFieldProblems,
} from '../../../lib/form-errors';
import { useCreatePatient } from '../hooks/use-create-patient';
import { parseUnitDate, unitDatePattern } from '../../../lib/unit-times';

type PatientFormValues = {
  recordNumber: string;
  givenName: string;
  familyName: string;
  dateOfBirth: string;
  email: string;
  emailConsent: boolean;
};

// An empty e-mail box means "no address", which the API takes as null.
const patientFormSchema = z.preprocess((values) => {
  const v = values as PatientFormValues;
  return { ...v, email: (v.email ?? '').trim() === '' ? null : v.email };
}, createPatientSchema) as unknown as z.ZodType<CreatePatient, PatientFormValues>;

const labels = {
  recordNumber: 'Record number',
  givenName: 'Given name',
  familyName: 'Family name',
  dateOfBirth: 'Date of birth',
  email: 'E-mail',
  emailConsent: 'Agreement to e-mail',
};
const fieldNames = [
  'recordNumber',
  'givenName',
  'familyName',
  'dateOfBirth',
  'email',
  'emailConsent',
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
};

export function AddPatientForm({ id, onCreated, onCancel }: AddPatientFormProps) {
  const createPatient = useCreatePatient();
  const {
    register,
    handleSubmit,
    setError,
    watch,
    reset,
    getValues,
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

  const onSubmit = handleSubmit((input) => {
    createPatient.mutate(input, {
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
        if (error.status === 400) applyServerFieldErrors(error, setError, fieldNames);
      },
    });
  });

  const error = createPatient.error;
  const fieldLevel =
    isApiRequestError(error) &&
    (error.code === 'record_number_taken' || (error.status === 400 && error.fields.length > 0));
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
      <form onSubmit={onSubmit} noValidate className="flex flex-col gap-5">
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
