import { zodResolver } from '@hookform/resolvers/zod';
import { useMutation, useQuery } from '@tanstack/react-query';
import { useForm } from 'react-hook-form';
import { Link } from 'react-router-dom';
import { z } from 'zod';
import { newPasswordSchema } from '../../../../shared/schemas/people';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { LoadingPanel } from '../../../components/ui/status-panel';
import { TextField } from '../../../components/ui/text-field';
import { paths } from '../../../config/paths';
import { describeError, isApiRequestError } from '../../../lib/api-client';
import { applyServerFieldErrors, readableMessage } from '../../../lib/form-errors';
import { checkPasswordLink, setPasswordWithLink } from '../api/passwords';
import { newPasswordHint } from './new-password-fields';

const formSchema = z
  .object({ password: newPasswordSchema('password'), repeat: z.string() })
  .refine((v) => v.password === v.repeat, {
    path: ['repeat'],
    message: 'repeat must be the same as the new password',
  });
type FormValues = z.infer<typeof formSchema>;

const labels = { password: 'New password', repeat: 'New password again' };

/** The page an e-mailed link opens: who the link is for, then the new password twice. */
export function SetPasswordForm({ token }: { token: string }) {
  const link = useQuery({
    queryKey: ['auth', 'password-link', token],
    queryFn: ({ signal }) => checkPasswordLink(token, { signal }),
    retry: false,
    staleTime: Infinity,
  });
  const save = useMutation({ mutationFn: setPasswordWithLink });
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors },
  } = useForm<FormValues>({
    resolver: zodResolver(formSchema),
    defaultValues: { password: '', repeat: '' },
  });

  if (
    !/^[A-Za-z0-9_-]{43}$/.test(token) ||
    (link.isError && isApiRequestError(link.error) && [400, 410].includes(link.error.status))
  ) {
    return (
      <Alert tone="error" title="This link does not work">
        <p>
          It has been used already, has expired, or was replaced by a newer one. Ask your
          administrator to send a new link.
        </p>
      </Alert>
    );
  }
  if (link.isError)
    return (
      <Alert tone="error" title="The link could not be checked">
        {describeError(link.error)}
      </Alert>
    );
  if (link.isPending) return <LoadingPanel label="Checking your link…" />;
  if (save.isSuccess) {
    return (
      <div role="status" className="space-y-4">
        <Alert tone="info" title="Your password is set" live="none">
          Sign in with your e-mail, {link.data.email}, and the password you just chose.
        </Alert>
        <Link
          to={paths.signIn.getHref()}
          className="inline-block rounded-lg bg-iris-700 px-4 py-2 font-medium text-white"
        >
          Go to sign in
        </Link>
      </div>
    );
  }

  const onSubmit = handleSubmit(({ password }) => {
    save.mutate(
      { token, password },
      {
        onError: (error) => {
          if (isApiRequestError(error) && error.status === 400)
            applyServerFieldErrors(error, setError, ['password'] as const);
        },
      },
    );
  });

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-5">
      <div>
        <h1 className="text-2xl font-semibold text-paper-950">
          {link.data.purpose === 'new-account' ? 'Welcome to Luxtempo' : 'Set a new password'}
        </h1>
        <p className="mt-1 text-paper-700">
          For {link.data.displayName} ({link.data.email}). This link works once.
        </p>
      </div>
      {save.isError && !(isApiRequestError(save.error) && save.error.status === 400) && (
        <Alert tone="error" title="The password was not set">
          {describeError(save.error)}
        </Alert>
      )}
      <input type="email" autoComplete="username" value={link.data.email} readOnly hidden />
      <TextField
        label={labels.password}
        type="password"
        autoComplete="new-password"
        hint={newPasswordHint}
        error={readableMessage(errors.password?.message, labels)}
        {...register('password')}
      />
      <TextField
        label={labels.repeat}
        type="password"
        autoComplete="new-password"
        error={readableMessage(errors.repeat?.message, labels)}
        {...register('repeat')}
      />
      <Button type="submit" busy={save.isPending} className="w-full">
        {save.isPending ? 'Saving…' : 'Set password'}
      </Button>
    </form>
  );
}
