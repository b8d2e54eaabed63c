import { roleLabels, type Role } from '../../../../shared/roles';
import { roleDuties } from '../../../config/role-duties';

/** Each of the person's roles with one line on what that role gets done in Luxtempo. */
export function RoleDutiesList({ roles }: { roles: readonly Role[] }) {
  if (roles.length === 0) {
    return (
      <p className="text-paper-700">
        Your account has no roles yet. Ask an administrator to give you the roles you work in.
      </p>
    );
  }
  return (
    <dl className="grid gap-3 lg:grid-cols-2">
      {roles.map((role) => (
        <div key={role} className="rounded-xl border border-paper-200 bg-white px-5 py-4">
          <dt className="font-semibold text-iris-800">{roleLabels[role]}</dt>
          <dd className="mt-1 text-paper-800">{roleDuties[role]}</dd>
        </div>
      ))}
    </dl>
  );
}
