import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { Dialog } from '../../../components/ui/dialog';
import { describeError, isApiRequestError } from '../../../lib/api-client';
import { applyServerFieldErrors, readableMessage } from '../../../lib/form-errors';
import type { VersionDetail } from '../api/protocol-response-schemas';
import { useDiscardDraft } from '../hooks/use-discard-draft';
import { useRetireVersion } from '../hooks/use-retire-version';
import { LabelledTextarea } from './labelled-textarea';

// The server's rule (server/protocols/routes.ts), worded with the field's key as the API words it.
const retireFormSchema = z.object({
  reason: z
    .string()
    .trim()
    .min(5, 'reason must be 5 to 500 characters')
    .max(500, 'reason must be 5 to 500 characters'),
});
type RetireForm = z.infer<typeof retireFormSchema>;
const labels = { reason: 'The reason' };

type RetireDialogProps = {
  version: VersionDetail;
  open: boolean;
  onDismiss: () => void;
  onRetired: (saved: VersionDetail) => void;
  /** Retire an approved version, or discard an unapproved draft: both end a version, with a reason. */
  kind?: 'retire' | 'discard';
};

type Words = {
  title: string;
  description: string;
  label: string;
  keep: string;
  submit: string;
  failed: string;
};

function wordsFor(kind: 'retire' | 'discard', version: VersionDetail): Words {
  if (kind === 'discard')
    return {
      title: `Discard draft ${version.version} of ${version.title}?`,
      description:
        'A discarded draft can never be edited or approved. It stays on record with your reason, and its version number is not given again. Approved versions are never discarded.',
      label: 'Reason for discarding',
      keep: 'Keep the draft',
      submit: `Discard draft ${version.version}`,
      failed: 'The draft was not discarded',
    };
  return {
    title: `Retire ${version.title}, version ${version.version}?`,
    description:
      'A retired version can no longer be chosen for new orders. Orders already made with it keep pointing at it, and it stays readable here. This cannot be undone.',
    label: 'Reason for retiring',
    keep: 'Keep in use',
    submit: `Retire version ${version.version}`,
    failed: 'The version was not retired',
  };
}

export function RetireDialog({
  version,
  open,
  onDismiss,
  onRetired,
  kind = 'retire',
}: RetireDialogProps) {
  const retire = useRetireVersion();
  const discard = useDiscardDraft();
  const mutation = kind === 'discard' ? discard : retire;
  const words = wordsFor(kind, version);
  const dismiss = () => {
    mutation.reset();
    onDismiss();
  };
  return (
    <Dialog
      open={open}
      onDismiss={dismiss}
      dismissible={!mutation.isPending}
      title={words.title}
      description={<p>{words.description}</p>}
    >
      {open && (
        <RetireForm
          key={`${version.key}-${version.version}`}
          version={version}
          mutation={mutation}
          words={words}
          onCancel={dismiss}
          onRetired={onRetired}
        />
      )}
    </Dialog>
  );
}

function RetireForm({
  version,
  mutation,
  words,
  onCancel,
  onRetired,
}: {
  version: VersionDetail;
  mutation: ReturnType<typeof useRetireVersion> | ReturnType<typeof useDiscardDraft>;
  words: Words;
  onCancel: () => void;
  onRetired: (saved: VersionDetail) => void;
}) {
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors },
  } = useForm<RetireForm>({
    resolver: zodResolver(retireFormSchema),
    defaultValues: { reason: '' },
  });

  const onSubmit = handleSubmit(({ reason }) => {
    mutation.mutate(
      { key: version.key, version: version.version, reason },
      {
        onSuccess: (saved) => {
          mutation.reset();
          onRetired(saved);
        },
        onError: (error) => {
          if (isApiRequestError(error) && error.status === 400)
            applyServerFieldErrors(error, setError, ['reason']);
        },
      },
    );
  });

  const error = mutation.error;
  const atField =
    isApiRequestError(error) &&
    error.status === 400 &&
    error.fields.some((f) => f.path === 'reason');
  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4">
      {error && !atField && (
        <Alert tone="error" title={words.failed}>
          {describeError(error)}
        </Alert>
      )}
      <LabelledTextarea
        label={words.label}
        hint="5 to 500 characters. Kept in the audit trail with your name."
        rows={4}
        error={readableMessage(errors.reason?.message, labels)}
        {...register('reason')}
      />
      <div className="flex flex-wrap justify-end gap-3">
        <Button variant="secondary" onClick={onCancel} disabled={mutation.isPending}>
          {words.keep}
        </Button>
        <Button type="submit" variant="danger" busy={mutation.isPending}>
          {words.submit}
        </Button>
      </div>
    </form>
  );
}
