import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { Dialog } from '../../../components/ui/dialog';
import { describeError, isApiRequestError } from '../../../lib/api-client';
import { applyServerFieldErrors, readableMessage } from '../../../lib/form-errors';
import type { VersionDetail } from '../api/protocol-response-schemas';
import { useRetireVersion } from '../hooks/use-retire-version';
import { LabelledTextarea } from './labelled-textarea';

// The server's rule (server/protocols/routes.ts), worded with the field's key as the API words it.
const retireFormSchema = z.object({
  reason: z.string().trim().min(5, 'reason must be 5 to 500 characters').max(500, 'reason must be 5 to 500 characters'),
});
type RetireForm = z.infer<typeof retireFormSchema>;
const labels = { reason: 'The reason' };

type RetireDialogProps = {
  version: VersionDetail;
  open: boolean;
  onDismiss: () => void;
  onRetired: (saved: VersionDetail) => void;
};

export function RetireDialog({ version, open, onDismiss, onRetired }: RetireDialogProps) {
  const retire = useRetireVersion();
  const dismiss = () => {
    retire.reset();
    onDismiss();
  };
  return (
    <Dialog
      open={open}
      onDismiss={dismiss}
      dismissible={!retire.isPending}
      title={`Retire ${version.title}, version ${version.version}?`}
      description={
        <p>
          A retired version can no longer be chosen for new orders. Orders already made with it keep pointing at it, and it stays
          readable here. This cannot be undone.
        </p>
      }
    >
      {open && <RetireForm key={`${version.key}-${version.version}`} version={version} mutation={retire} onCancel={dismiss} onRetired={onRetired} />}
    </Dialog>
  );
}

function RetireForm({
  version,
  mutation,
  onCancel,
  onRetired,
}: {
  version: VersionDetail;
  mutation: ReturnType<typeof useRetireVersion>;
  onCancel: () => void;
  onRetired: (saved: VersionDetail) => void;
}) {
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors },
  } = useForm<RetireForm>({ resolver: zodResolver(retireFormSchema), defaultValues: { reason: '' } });

  const onSubmit = handleSubmit(({ reason }) => {
    mutation.mutate(
      { key: version.key, version: version.version, reason },
      {
        onSuccess: (saved) => {
          mutation.reset();
          onRetired(saved);
        },
        onError: (error) => {
          if (isApiRequestError(error) && error.status === 400) applyServerFieldErrors(error, setError, ['reason']);
        },
      },
    );
  });

  const error = mutation.error;
  const atField = isApiRequestError(error) && error.status === 400 && error.fields.some((f) => f.path === 'reason');
  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4">
      {error && !atField && (
        <Alert tone="error" title="The version was not retired">
          {describeError(error)}
        </Alert>
      )}
      <LabelledTextarea
        label="Reason for retiring"
        hint="5 to 500 characters. Kept in the audit trail with your name."
        rows={4}
        error={readableMessage(errors.reason?.message, labels)}
        {...register('reason')}
      />
      <div className="flex flex-wrap justify-end gap-3">
        <Button variant="secondary" onClick={onCancel} disabled={mutation.isPending}>
          Keep in use
        </Button>
        <Button type="submit" variant="danger" busy={mutation.isPending}>
          Retire version {version.version}
        </Button>
      </div>
    </form>
  );
}
