import { zodResolver } from '@hookform/resolvers/zod';
import { useMutation } from '@tanstack/react-query';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { newPasswordSchema } from '../../../../shared/schemas/people';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { TextField } from '../../../components/ui/text-field';
import { describeError, isApiRequestError } from '../../../lib/api-client';
import { applyServerFieldErrors, readableMessage } from '../../../lib/form-errors';
import { changePassword } from '../api/passwords';
import { newPasswordHint } from './new-password-fields';

const formSchema = z
  .object({
    currentPassword: z.string().min(1, 'currentPassword is required'),
    newPassword: newPasswordSchema('newPassword'),
    repeat: z.string(),
  })
  .refine((v) => v.newPassword === v.repeat, {
    path: ['repeat'],
    message: 'repeat must be the same as the new password',
  });
type FormValues = z.infer<typeof formSchema>;

const labels = {
  currentPassword: 'Current password',
  newPassword: 'New password',
  repeat: 'New password again',
};
const fieldNames = ['currentPassword', 'newPassword'] as const;

export function ChangePasswordForm() {
  const change = useMutation({ mutationFn: changePassword });
  const {
    register,
    handleSubmit,
    setError,
    reset,
    formState: { errors },
  } = useForm<FormValues>({
    resolver: zodResolver(formSchema),
    defaultValues: { currentPassword: '', newPassword: '', repeat: '' },
  });

  const onSubmit = handleSubmit(({ currentPassword, newPassword }) => {
    change.mutate(
      { currentPassword, newPassword },
      {
        onSuccess: () => reset(),
        onError: (error) => {
          if (isApiRequestError(error) && error.status === 400)
            applyServerFieldErrors(error, setError, fieldNames);
        },
      },
    );
  });

  return (
    <form onSubmit={onSubmit} noValidate className="flex max-w-md flex-col gap-5">
      <div role="status" className={change.isSuccess ? '' : 'sr-only'}>
        {change.isSuccess && (
          <Alert tone="info" title="Your password was changed" live="none">
            You stay signed in here; every other place you were signed in has been signed out.
          </Alert>
        )}
      </div>
      {change.isError && !(isApiRequestError(change.error) && change.error.status === 400) && (
        <Alert tone="error" title="The password was not changed">
          {describeError(change.error)}
        </Alert>
      )}
      <TextField
        label={labels.currentPassword}
        type="password"
        autoComplete="current-password"
        error={readableMessage(errors.currentPassword?.message, labels)}
        {...register('currentPassword')}
      />
      <TextField
        label={labels.newPassword}
        type="password"
        autoComplete="new-password"
        hint={newPasswordHint}
        error={readableMessage(errors.newPassword?.message, labels)}
        {...register('newPassword')}
      />
      <TextField
        label={labels.repeat}
        type="password"
        autoComplete="new-password"
        error={readableMessage(errors.repeat?.message, labels)}
        {...register('repeat')}
      />
      <Button type="submit" busy={change.isPending} className="self-start">
        {change.isPending ? 'Changing…' : 'Change password'}
      </Button>
    </form>
  );
}
