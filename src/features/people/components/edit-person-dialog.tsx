import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import { createPersonSchema, type Person } from '../../../../shared/schemas/people';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { Dialog } from '../../../components/ui/dialog';
import { TextField } from '../../../components/ui/text-field';
import { describeError, isApiRequestError } from '../../../lib/api-client';
import {
  applyServerFieldErrors,
  readableMessage,
  unplacedFieldProblems,
} from '../../../lib/form-errors';
import { useUpdatePerson } from '../hooks/use-update-person';
import { FieldProblemList } from './field-problem-list';
import { RoleCheckboxes } from './role-checkboxes';

// The same rules as for a new person, so an edit can never save what creation would refuse.
const editPersonSchema = createPersonSchema.pick({ displayName: true, roles: true });
type EditInput = z.input<typeof editPersonSchema>;
type EditOutput = z.output<typeof editPersonSchema>;

const labels = { displayName: 'Display name', roles: 'Roles' };
const fieldNames = ['displayName', 'roles'] as const;

type EditPersonDialogProps = {
  person: Person | null;
  onDismiss: () => void;
  onSaved: (person: Person) => void;
};

export function EditPersonDialog({ person, onDismiss, onSaved }: EditPersonDialogProps) {
  const updatePerson = useUpdatePerson();
  return (
    <Dialog
      open={person !== null}
      onDismiss={() => {
        updatePerson.reset();
        onDismiss();
      }}
      dismissible={!updatePerson.isPending}
      title={person ? `Edit ${person.displayName}` : 'Edit person'}
      description={
        person ? (
          <p>E-mail {person.email}. The e-mail address cannot be changed here.</p>
        ) : undefined
      }
    >
      {person && (
        <EditPersonForm
          // A fresh form per person, so one person's half-made changes never appear on another's.
          key={person.id}
          person={person}
          mutation={updatePerson}
          onCancel={() => {
            updatePerson.reset();
            onDismiss();
          }}
          onSaved={onSaved}
        />
      )}
    </Dialog>
  );
}

function EditPersonForm({
  person,
  mutation,
  onCancel,
  onSaved,
}: {
  person: Person;
  mutation: ReturnType<typeof useUpdatePerson>;
  onCancel: () => void;
  onSaved: (person: Person) => void;
}) {
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors },
  } = useForm<EditInput, unknown, EditOutput>({
    resolver: zodResolver(editPersonSchema),
    defaultValues: { displayName: person.displayName, roles: person.roles },
  });

  const onSubmit = handleSubmit((changes) => {
    mutation.mutate(
      { id: person.id, changes },
      {
        onSuccess: (saved) => {
          mutation.reset();
          onSaved(saved);
        },
        onError: (error) => {
          if (!isApiRequestError(error)) return;
          // The server refuses to let an administrator remove their own administrator role.
          if (error.code === 'own_admin_role' || error.code === 'own_clinical_role')
            setError('roles', { type: 'server', message: error.message }, { shouldFocus: true });
          if (error.status === 400) applyServerFieldErrors(error, setError, fieldNames);
        },
      },
    );
  });

  const error = mutation.error;
  const shownAtField =
    isApiRequestError(error) &&
    (error.code === 'own_admin_role' ||
      error.code === 'own_clinical_role' ||
      (error.status === 400 && error.fields.length > 0));
  const unplaced = isApiRequestError(error) ? unplacedFieldProblems(error, fieldNames) : [];

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-5">
      {error &&
        (shownAtField ? (
          <Alert tone="error" title="Changes not saved: check the fields marked below">
            {unplaced.length > 0 && <FieldProblemList problems={unplaced} labels={labels} />}
          </Alert>
        ) : (
          <Alert tone="error" title="Changes not saved">
            {describeError(error)}
          </Alert>
        ))}
      <TextField
        label="Display name"
        autoComplete="off"
        error={readableMessage(errors.displayName?.message, labels)}
        {...register('displayName')}
      />
      <RoleCheckboxes
        registration={register('roles')}
        error={readableMessage(errors.roles?.message, labels)}
      />
      <div className="flex flex-wrap justify-end gap-3">
        <Button variant="secondary" onClick={onCancel} disabled={mutation.isPending}>
          Cancel
        </Button>
        <Button type="submit" busy={mutation.isPending}>
          {mutation.isPending ? 'Saving…' : 'Save changes'}
        </Button>
      </div>
    </form>
  );
}
