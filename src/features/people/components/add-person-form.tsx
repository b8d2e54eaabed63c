import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import { createPersonSchema, type Person } from '../../../../shared/schemas/people';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { TextField } from '../../../components/ui/text-field';
import { describeError, isApiRequestError } from '../../../lib/api-client';
import {
  applyServerFieldErrors,
  readableMessage,
  unplacedFieldProblems,
} from '../../../lib/form-errors';
import { useCreatePerson } from '../hooks/use-create-person';
import { FieldProblemList } from './field-problem-list';
import { RoleCheckboxes } from './role-checkboxes';

type CreateInput = z.input<typeof createPersonSchema>;
type CreateOutput = z.output<typeof createPersonSchema>;

const labels = { displayName: 'Display name', email: 'E-mail', roles: 'Roles' };
const fieldNames = ['displayName', 'email', 'roles'] as const;

type AddPersonFormProps = {
  id: string;
  onCreated: (person: Person) => void;
  onCancel: () => void;
};

export function AddPersonForm({ id, onCreated, onCancel }: AddPersonFormProps) {
  const createPerson = useCreatePerson();
  const {
    register,
    handleSubmit,
    setError,
    reset,
    formState: { errors },
  } = useForm<CreateInput, unknown, CreateOutput>({
    resolver: zodResolver(createPersonSchema),
    defaultValues: { displayName: '', email: '', roles: [] },
  });

  const onSubmit = handleSubmit((input) => {
    createPerson.mutate(input, {
      onSuccess: (person) => {
        reset();
        onCreated(person);
      },
      onError: (error) => {
        if (!isApiRequestError(error)) return;
        if (error.code === 'email_taken')
          setError('email', { type: 'server', message: error.message }, { shouldFocus: true });
        if (error.status === 400) applyServerFieldErrors(error, setError, fieldNames);
      },
    });
  });

  const error = createPerson.error;
  // Problems shown beside their field are only pointed to here, not repeated.
  const fieldLevel =
    isApiRequestError(error) &&
    (error.code === 'email_taken' || (error.status === 400 && error.fields.length > 0));
  const unplaced = isApiRequestError(error) ? unplacedFieldProblems(error, fieldNames) : [];

  return (
    <section
      id={id}
      aria-labelledby={`${id}-heading`}
      className="mb-8 rounded-2xl border border-paper-200 bg-white p-6"
    >
      <h2 id={`${id}-heading`} className="mb-1 text-xl font-semibold text-paper-950">
        Add a person
      </h2>
      <p className="mb-5 text-paper-700">
        The person is e-mailed a one-time link to set their own password. A clinician or pharmacist
        role waits until another administrator approves it.
      </p>
      <form onSubmit={onSubmit} noValidate className="flex flex-col gap-5">
        {error &&
          (fieldLevel ? (
            <Alert tone="error" title="The person was not added: check the fields marked below">
              {unplaced.length > 0 && <FieldProblemList problems={unplaced} labels={labels} />}
            </Alert>
          ) : (
            <Alert tone="error" title="The person was not added">
              {describeError(error)}
            </Alert>
          ))}
        <div className="grid gap-5 md:grid-cols-2">
          <TextField
            label="Display name"
            autoComplete="off"
            error={readableMessage(errors.displayName?.message, labels)}
            {...register('displayName')}
          />
          <TextField
            label="E-mail"
            type="email"
            inputMode="email"
            autoComplete="off"
            spellCheck={false}
            error={readableMessage(errors.email?.message, labels)}
            {...register('email')}
          />
        </div>
        <RoleCheckboxes
          registration={register('roles')}
          error={readableMessage(errors.roles?.message, labels)}
        />
        <div className="flex flex-wrap gap-3">
          <Button type="submit" busy={createPerson.isPending}>
            {createPerson.isPending ? 'Adding…' : 'Add person'}
          </Button>
          <Button variant="secondary" onClick={onCancel} disabled={createPerson.isPending}>
            Cancel
          </Button>
        </div>
      </form>
    </section>
  );
}
