import { NavLink } from 'react-router-dom';
import type { SessionUser } from '../../../shared/schemas/auth';
import { hasCapability } from '../../features/auth/hooks/use-session';
import { navItems } from './nav-items';

export function MainNav({ user }: { user: SessionUser }) {
  const visible = navItems.filter((item) => hasCapability(user, item.capability));
  return (
    <nav aria-label="Main" className="print:hidden">
      <ul className="flex flex-wrap gap-1 xl:flex-col">
        {visible.map(({ label, to, icon: Icon, end }) => (
          <li key={to}>
            <NavLink
              to={to}
              end={end}
              className={({ isActive }) =>
                // The current page is marked by a bar, a raised card and bold text, not by colour alone.
                'relative flex min-h-tap items-center gap-3 rounded-lg py-2 pr-4 pl-4 text-base ' +
                (isActive
                  ? 'bg-white font-semibold text-iris-800 shadow-sm ring-1 ring-paper-200 before:absolute before:rounded-full before:bg-iris-700 before:inset-x-3 before:bottom-0 before:h-1 xl:before:inset-x-auto xl:before:inset-y-2 xl:before:left-0 xl:before:h-auto xl:before:w-1'
                  : 'font-medium text-paper-800 hover:bg-paper-200')
              }
            >
              <Icon className="size-5" />
              {label}
            </NavLink>
          </li>
        ))}
      </ul>
    </nav>
  );
}
