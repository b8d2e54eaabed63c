import { useEffect } from 'react';
import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import type { loginRequestSchema } from '../../../../shared/schemas/auth';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { TextField } from '../../../components/ui/text-field';
import { isApiRequestError, describeError, type ApiRequestError } from '../../../lib/api-client';
import { applyServerFieldErrors, readableMessage } from '../../../lib/form-errors';
import { lazyResolver } from '../../../lib/lazy-resolver';
import { useLogIn } from '../hooks/use-log-in';

type LoginInput = z.input<typeof loginRequestSchema>;
type LoginOutput = z.output<typeof loginRequestSchema>;

// The sign-in page is the first page of the day: its checks (and zod) load after it shows.
const signInChecks = lazyResolver<LoginInput, LoginOutput>(async () => {
  const [{ zodResolver }, { loginRequestSchema }] = await Promise.all([
    import('@hookform/resolvers/zod'),
    import('../../../../shared/schemas/auth'),
  ]);
  return zodResolver(loginRequestSchema);
});

const labels = { email: 'E-mail', password: 'Password' };
const fieldNames = ['email', 'password'] as const;

export function SignInForm() {
  const logIn = useLogIn();
  useEffect(() => signInChecks.preload(), []);
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors },
  } = useForm<LoginInput, unknown, LoginOutput>({
    resolver: signInChecks.resolver,
    defaultValues: { email: '', password: '' },
  });

  const onSubmit = handleSubmit((credentials) => {
    logIn.mutate(credentials, {
      onError: (error) => {
        if (isApiRequestError(error) && error.status === 400)
          applyServerFieldErrors(error, setError, fieldNames);
      },
    });
  });

  return (
    <form
      onSubmit={onSubmit}
      noValidate
      aria-labelledby="sign-in-heading"
      className="flex flex-col gap-5"
    >
      <h1 id="sign-in-heading" className="text-2xl font-semibold text-paper-950">
        Sign in
      </h1>

      {logIn.isError && <SignInProblem error={logIn.error} />}

      <TextField
        label="E-mail"
        type="email"
        autoComplete="username"
        inputMode="email"
        spellCheck={false}
        error={readableMessage(errors.email?.message, labels)}
        {...register('email')}
      />
      <TextField
        label="Password"
        type="password"
        autoComplete="current-password"
        error={readableMessage(errors.password?.message, labels)}
        {...register('password')}
      />
      <Button type="submit" busy={logIn.isPending} className="mt-1 w-full">
        {logIn.isPending ? 'Signing in…' : 'Sign in'}
      </Button>
    </form>
  );
}

function SignInProblem({ error }: { error: Error }) {
  if (!isApiRequestError(error))
    return (
      <Alert tone="error" title="Could not sign in">
        {describeError(error)}
      </Alert>
    );
  return (
    <Alert tone="error" title={titleFor(error)}>
      <p>{error.message}</p>
      {error.status === 429 && error.retryAfterS !== null && (
        <p className="mt-1 font-medium">{waitSentence(error.retryAfterS)}</p>
      )}
    </Alert>
  );
}

function titleFor(error: ApiRequestError): string {
  if (error.status === 429) return 'Sign-in paused';
  if (error.status === 400) return 'Check the highlighted fields';
  if (error.status === 0 || error.status >= 500) return 'Luxtempo is not answering';
  return 'Could not sign in';
}

/** Retry-After comes in seconds; people plan in minutes, so round up and never say zero. */
export function waitSentence(retryAfterS: number): string {
  const minutes = Math.max(1, Math.ceil(retryAfterS / 60));
  return `You can try again in about ${minutes} ${minutes === 1 ? 'minute' : 'minutes'}.`;
}
