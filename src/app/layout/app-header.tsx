import { Link } from 'react-router-dom';
import { roleLabels } from '../../../shared/roles';
import type { SessionUser } from '../../../shared/schemas/auth';
import { Button } from '../../components/ui/button';
import { MarkIcon, SignOutIcon } from '../../components/ui/icons-first';
import { paths } from '../../config/paths';
import { useLogOut } from '../../features/auth/hooks/use-log-out';
import { describeError } from '../../lib/api-client';

export function AppHeader({ user }: { user: SessionUser }) {
  const logOut = useLogOut(user.id);
  const roleLine = user.roles.map((role) => roleLabels[role]).join(' · ');

  return (
    <header className="border-b border-paper-200 bg-paper-100 print:hidden">
      <div className="flex flex-wrap items-center justify-between gap-x-6 gap-y-2 px-5 py-3">
        <Link to={paths.today.getHref()} className="flex items-center gap-3 rounded-lg pr-2">
          <MarkIcon className="size-9" />
          <span className="text-xl font-semibold tracking-tight text-paper-950">Luxtempo</span>
        </Link>

        <div className="flex items-center gap-4">
          <div className="text-right leading-tight">
            <p className="font-medium text-paper-950">
              <span className="sr-only">Signed in as </span>
              {user.displayName}
            </p>
            <p className="text-sm text-paper-600">
              <span className="sr-only">Roles: </span>
              {roleLine || 'No roles yet'}
            </p>
          </div>
          <Link
            to={paths.changePassword.getHref()}
            className="rounded-lg px-2 py-1 text-sm font-medium text-iris-800 underline underline-offset-2 print:hidden"
          >
            Change password
          </Link>
          <Button
            variant="secondary"
            size="sm"
            icon={<SignOutIcon className="size-4" />}
            busy={logOut.isPending}
            onClick={() => logOut.mutate()}
          >
            {logOut.isPending ? 'Signing out…' : 'Sign out'}
          </Button>
        </div>
      </div>
      {logOut.isError && (
        <p
          role="alert"
          className="border-t border-alarm-200 bg-alarm-50 px-5 py-2 text-sm font-medium text-alarm-800"
        >
          You are still signed in: {describeError(logOut.error)}
        </p>
      )}
    </header>
  );
}
