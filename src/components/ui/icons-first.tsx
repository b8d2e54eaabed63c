import {
  Archive,
  ArrowRightLeft,
  BookText,
  ChartColumn,
  Gauge,
  CheckCheck,
  ChevronRight,
  CircleCheck,
  CircleDashed,
  CircleX,
  ClipboardList,
  Clock,
  FileText,
  Flag,
  History,
  Hourglass,
  IdCard,
  LogOut,
  Mails,
  OctagonMinus,
  Signature,
  Sunrise,
  Undo2,
  Unplug,
  Users,
  CalendarDays,
  ChartBarStacked,
  Package,
  PackageSearch,
} from 'lucide-react';
import { Icon, fromPackage, type IconProps } from './icon-base';

/**
 * The icons of the first signed-in page: the signed-in frame and Today import from here (see
 * ./icon-base.tsx); every other module imports from ./icons.tsx, which has these too.
 */
export * from './icons-start';

/* Navigation, actions and states (from the package). */
export const SunriseIcon = fromPackage(Sunrise);
export const PeopleIcon = fromPackage(Users);
export const SignOutIcon = fromPackage(LogOut);
export const CheckCircleIcon = fromPackage(CircleCheck);
export const PlugOffIcon = fromPackage(Unplug);
export const ProtocolBookIcon = fromPackage(BookText);
/** A circle of dashes: something not yet settled (a draft). */
export const DraftCircleIcon = fromPackage(CircleDashed);
export const ArchiveBoxIcon = fromPackage(Archive);
/** Two opposed arrows: a value that was replaced by another. */
export const SwapIcon = fromPackage(ArrowRightLeft);
export const SignatureIcon = fromPackage(Signature);
/** Envelopes waiting to go out: the outbox. */
export const OutboxTrayIcon = fromPackage(Mails);
export const HourglassIcon = fromPackage(Hourglass);
/** A circle with a cross: stopped, refused, no longer usable. */
export const CrossCircleIcon = fromPackage(CircleX);
export const ClockIcon = fromPackage(Clock);
export const ChevronRightIcon = fromPackage(ChevronRight);
export const OrderClipboardIcon = fromPackage(ClipboardList);
export const PatientCardIcon = fromPackage(IdCard);
/** A page of ruled lines: what was given, for the record. */
export const RecordLedgerIcon = fromPackage(FileText);
/** Columns of a chart: figures month by month. */
export const TrendBarsIcon = fromPackage(ChartColumn);
export const DeviceGaugeIcon = fromPackage(Gauge);
/** A clock turning back: who did what, and when. */
export const TrailLogIcon = fromPackage(History);

/* An order's statuses: each its own glyph (the status word always stands beside it). */
/** An arrow curling back: an order sent back to the clinician. */
export const StatusReturnedIcon = fromPackage(Undo2);
/** Two ticks: a figure checked by a second person. */
export const StatusCheckedIcon = fromPackage(CheckCheck);
/** A clock face: the session is running. */
export const StatusInSessionIcon = fromPackage(Clock);
/** A flag: the treatment was given in full. */
export const StatusCompletedIcon = fromPackage(Flag);
/** An octagon with a bar: the session was stopped before the end. */
export const StatusStoppedIcon = fromPackage(OctagonMinus);

export function LightBeamIcon(props: IconProps) {
  return (
    <Icon {...props}>
      <rect x="2.5" y="9" width="7" height="6" rx="1.5" />
      <path d="M9.5 12h4" />
      <path d="M13.5 12l7-5M13.5 12l7 5M13.5 12h7" />
    </Icon>
  );
}

/** A vial with a tick: a drug dose that is checked. */
export function VialCheckIcon(props: IconProps) {
  return (
    <Icon {...props}>
      <path d="M7 3h7M8.5 3v4.5L5 17a3 3 0 0 0 2.8 4h5.9" />
      <path d="M12.5 3v4.5l1.5 4" />
      <path d="M6.5 13h6" />
      <path d="M14.5 18l2 2 4-4.5" />
    </Icon>
  );
}

/** A vial: the drug made up and waiting. */
export function StatusPreparedIcon(props: IconProps) {
  return (
    <Icon {...props}>
      <path d="M9 2.5h6M10 2.5v4.5l-4.2 9.2A3 3 0 0 0 8.5 20.5h7a3 3 0 0 0 2.7-4.3L14 7V2.5" />
      <path d="M7.5 14h9" />
    </Icon>
  );
}

/** A straight course with one stretch bent off it: a departure from protocol. */
export function DeviationPathIcon(props: IconProps) {
  return (
    <Icon {...props}>
      <path d="M3 17h5l3-8 3 8h7" />
      <path d="M8 17h6" strokeDasharray="1.5 2.5" />
    </Icon>
  );
}

/** Treatment lists, the pharmacy's stock, a lot's recall and the monthly drug use. */
export const ListCalendarIcon = fromPackage(CalendarDays);
export const StockBoxIcon = fromPackage(Package);
export const RecallSearchIcon = fromPackage(PackageSearch);
export const DrugUseBarsIcon = fromPackage(ChartBarStacked);
