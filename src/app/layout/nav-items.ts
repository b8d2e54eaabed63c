import type { ComponentType, SVGProps } from 'react';
import type { Capability } from '../../../shared/roles';
import { PeopleIcon, SunriseIcon } from '../../components/ui/icons';
import { paths } from '../../config/paths';

export type NavItem = {
  label: string;
  to: string;
  /** Shown only to people whose capabilities (from the server) include this one. */
  capability: Capability;
  icon: ComponentType<Omit<SVGProps<SVGSVGElement>, 'children'>>;
  /** Match the address exactly, so Today is not marked current on every page. */
  end?: boolean;
};

export const navItems: readonly NavItem[] = [
  { label: 'Today', to: paths.today.getHref(), capability: 'today.view', icon: SunriseIcon, end: true },
  { label: 'People', to: paths.people.getHref(), capability: 'people.manage', icon: PeopleIcon },
];
