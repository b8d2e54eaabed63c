import { useEffect, useRef, useState, type FormEvent } from 'react';
import type { loginRequestSchema as LoginSchema } from '../../../../shared/schemas/auth';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { TextField } from '../../../components/ui/text-field';
import { isApiRequestError, describeError, type ApiRequestError } from '../../../lib/api-client';
import { readableMessage } from '../../../lib/form-errors';
import { useLogIn } from '../hooks/use-log-in';

const labels = { email: 'E-mail', password: 'Password' };
const fieldNames = ['email', 'password'] as const;
type Field = (typeof fieldNames)[number];
type Problems = Partial<Record<Field, string>>;

// The sign-in page is the first page of the day and must load fast on a ward tablet: its two
// fields are a plain form (react-hook-form would add 13 kB to the first load for two inputs),
// and its checks — the same zod schema the server applies — load after the page shows. If they
// cannot load (the network dropped), the server's own checks answer, field by field.
let checksLoading: Promise<typeof LoginSchema> | undefined;
const signInChecks = () =>
  (checksLoading ??= import('../../../../shared/schemas/auth').then(
    (m) => m.loginRequestSchema,
    (error: unknown) => {
      checksLoading = undefined;
      throw error;
    },
  ));

/** The first problem of each field, from zod's issues or the server's 400 answer. */
function problemsOf(found: { path: string; message: string }[]): Problems {
  const problems: Problems = {};
  for (const { path, message } of found) {
    const field = fieldNames.find((name) => name === path.split(/[.[]/)[0]);
    if (field && !problems[field]) problems[field] = message;
  }
  return problems;
}

export function SignInForm() {
  const logIn = useLogIn();
  const [problems, setProblems] = useState<Problems>({});
  const inputs = useRef<Partial<Record<Field, HTMLInputElement | null>>>({});
  useEffect(() => void signInChecks().catch(() => undefined), []);

  const show = (found: Problems) => {
    setProblems(found);
    const first = fieldNames.find((name) => found[name]);
    if (first) inputs.current[first]?.focus();
  };

  const onSubmit = async (event: FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    const form = new FormData(event.currentTarget);
    const typed = {
      email: String(form.get('email') ?? ''),
      password: String(form.get('password') ?? ''),
    };
    const schema = await signInChecks().catch(() => null);
    let credentials = typed;
    if (schema) {
      const checked = schema.safeParse(typed);
      if (!checked.success) {
        show(
          problemsOf(
            checked.error.issues.map((i) => ({ path: i.path.join('.'), message: i.message })),
          ),
        );
        return;
      }
      credentials = checked.data;
    }
    setProblems({});
    logIn.mutate(credentials, {
      onError: (error) => {
        if (isApiRequestError(error) && error.status === 400) show(problemsOf(error.fields));
      },
    });
  };

  return (
    <form
      onSubmit={(event) => void onSubmit(event)}
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
        name="email"
        type="email"
        autoComplete="username"
        inputMode="email"
        spellCheck={false}
        error={readableMessage(problems.email, labels)}
        ref={(element) => {
          inputs.current.email = element;
        }}
      />
      <TextField
        label="Password"
        name="password"
        type="password"
        autoComplete="current-password"
        error={readableMessage(problems.password, labels)}
        ref={(element) => {
          inputs.current.password = element;
        }}
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
