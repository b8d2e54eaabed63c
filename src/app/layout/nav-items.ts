import type { ComponentType, SVGProps } from 'react';
import type { Capability } from '../../../shared/roles';
import {
  CrossCircleIcon,
  LightBeamIcon,
  OutboxTrayIcon,
  PeopleIcon,
  ProtocolBookIcon,
  SunriseIcon,
  VialCheckIcon,
} from '../../components/ui/icons-first';
import { OrderClipboardIcon, PatientCardIcon } from '../../components/ui/icons-first';
import {
  DeviationPathIcon,
  RecordLedgerIcon,
  TrailLogIcon,
  TrendBarsIcon,
} from '../../components/ui/icons-first';
import {
  DeviceGaugeIcon,
  DrugUseBarsIcon,
  ListCalendarIcon,
  RecallSearchIcon,
  StockBoxIcon,
} from '../../components/ui/icons-first';
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
  {
    label: 'Today',
    to: paths.today.getHref(),
    capability: 'today.view',
    icon: SunriseIcon,
    end: true,
  },
  {
    label: 'Dose checks',
    to: paths.doseChecks.getHref(),
    capability: 'dose-checks.perform',
    icon: VialCheckIcon,
  },
  {
    label: 'Lists',
    to: paths.lists.getHref(),
    capability: 'lists.read',
    icon: ListCalendarIcon,
  },
  { label: 'Stock', to: paths.stock.getHref(), capability: 'stock.read', icon: StockBoxIcon },
  {
    label: 'Recall',
    to: paths.recall.getHref(),
    capability: 'stock.recall',
    icon: RecallSearchIcon,
  },
  {
    label: 'Drug use',
    to: paths.drugUse.getHref(),
    capability: 'stock.read',
    icon: DrugUseBarsIcon,
  },
  {
    label: 'Orders',
    to: paths.orders.getHref(),
    capability: 'orders.read',
    icon: OrderClipboardIcon,
  },
  {
    label: 'Patients',
    to: paths.patients.getHref(),
    capability: 'patients.read',
    icon: PatientCardIcon,
  },
  {
    label: 'Protocols',
    to: paths.protocols.getHref(),
    capability: 'protocols.read',
    icon: ProtocolBookIcon,
  },
  {
    label: 'Deviations',
    to: paths.deviations.getHref(),
    capability: 'audit.read',
    icon: DeviationPathIcon,
  },
  {
    label: 'Dose records',
    to: paths.doseRecords.getHref(),
    capability: 'audit.read',
    icon: RecordLedgerIcon,
  },
  { label: 'Trends', to: paths.trends.getHref(), capability: 'audit.read', icon: TrendBarsIcon },
  {
    label: 'Outcomes',
    to: paths.outcomes.getHref(),
    capability: 'outcomes.read',
    icon: TrendBarsIcon,
  },
  {
    label: 'Audit trail',
    to: paths.auditTrail.getHref(),
    capability: 'audit.read',
    icon: TrailLogIcon,
  },
  {
    label: 'Devices',
    to: paths.devices.getHref(),
    capability: 'devices.read',
    icon: DeviceGaugeIcon,
  },
  {
    label: 'Light calculator',
    to: paths.lightCalculator.getHref(),
    capability: 'calculations.run',
    icon: LightBeamIcon,
  },
  { label: 'People', to: paths.people.getHref(), capability: 'people.manage', icon: PeopleIcon },
  {
    label: 'Cancel orders',
    to: paths.orderCancelling.getHref(),
    capability: 'orders.list-cancellable',
    icon: CrossCircleIcon,
  },
  { label: 'Outbox', to: paths.outbox.getHref(), capability: 'outbox.read', icon: OutboxTrayIcon },
];
