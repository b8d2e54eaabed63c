import type { ReactNode, SVGProps } from 'react';
import {
  Archive,
  ArrowLeft,
  ArrowRightLeft,
  BookText,
  ChartColumn,
  Gauge,
  CheckCheck,
  ChevronDown,
  ChevronLeft,
  ChevronRight,
  ChevronsUpDown,
  ChevronUp,
  CircleCheck,
  CircleDashed,
  CirclePause,
  CirclePlay,
  CircleStop,
  CircleX,
  ClipboardList,
  Clock,
  CloudCheck,
  CloudUpload,
  Columns2,
  CopyPlus,
  Download,
  Droplet,
  Equal,
  Eye,
  EyeOff,
  FileOutput,
  FileText,
  Flag,
  FlagTriangleRight,
  History,
  Hourglass,
  IdCard,
  Info,
  LoaderCircle,
  Lock,
  LogOut,
  Mail,
  Mails,
  Minus,
  OctagonMinus,
  Paperclip,
  Pencil,
  Plus,
  Printer,
  RotateCw,
  Search,
  Send,
  Sigma,
  Signature,
  Sunrise,
  TriangleAlert,
  Undo2,
  Unplug,
  Upload,
  Users,
  Volume2,
  VolumeX,
  type LucideIcon,
  CalendarDays,
  ChartBarStacked,
  Package,
  PackageSearch,
} from 'lucide-react';

/**
 * The app's icons. Generic ones come from the icon package (lucide-react); the glyphs no
 * package has (the laser, eye protection, the vial, corneal thickness, the leak, severity
 * levels, the deviation path, light after the photosensitiser, the screen kept awake and the
 * mark) are drawn here in the same 24-unit, 2-stroke style. Icons are decorative: the word
 * beside an icon carries the meaning, so each one is hidden from assistive technology.
 */
type IconProps = Omit<SVGProps<SVGSVGElement>, 'children'>;

function Icon({ className = 'size-5', children, ...rest }: IconProps & { children: ReactNode }) {
  return (
    <svg
      viewBox="0 0 24 24"
      fill="none"
      stroke="currentColor"
      strokeWidth={2}
      strokeLinecap="round"
      strokeLinejoin="round"
      aria-hidden="true"
      focusable="false"
      className={`shrink-0 ${className}`}
      {...rest}
    >
      {children}
    </svg>
  );
}

/** The package's glyph under the project's name, sized and hidden like the drawn ones. */
function fromPackage(Glyph: LucideIcon) {
  function PackageIcon({ className = 'size-5', ...rest }: IconProps) {
    return (
      <Glyph aria-hidden="true" focusable="false" className={`shrink-0 ${className}`} {...rest} />
    );
  }
  return PackageIcon;
}

/* Navigation, actions and states (from the package). */
export const SunriseIcon = fromPackage(Sunrise);
export const PeopleIcon = fromPackage(Users);
export const SignOutIcon = fromPackage(LogOut);
export const CheckCircleIcon = fromPackage(CircleCheck);
export const PauseCircleIcon = fromPackage(CirclePause);
export const AlertIcon = fromPackage(TriangleAlert);
export const InfoIcon = fromPackage(Info);
export const PlugOffIcon = fromPackage(Unplug);
export const PlusIcon = fromPackage(Plus);
export const PencilIcon = fromPackage(Pencil);
export const LockIcon = fromPackage(Lock);
export const ArrowLeftIcon = fromPackage(ArrowLeft);
export const ReloadIcon = fromPackage(RotateCw);
export const ProtocolBookIcon = fromPackage(BookText);
/** A circle of dashes: something not yet settled (a draft). */
export const DraftCircleIcon = fromPackage(CircleDashed);
export const ArchiveBoxIcon = fromPackage(Archive);
export const UploadIcon = fromPackage(Upload);
export const CopyDraftIcon = fromPackage(CopyPlus);
export const SideBySideIcon = fromPackage(Columns2);
export const MinusIcon = fromPackage(Minus);
/** Two opposed arrows: a value that was replaced by another. */
export const SwapIcon = fromPackage(ArrowRightLeft);
export const EqualsIcon = fromPackage(Equal);
export const SignatureIcon = fromPackage(Signature);
export const SigmaIcon = fromPackage(Sigma);
/** Envelopes waiting to go out: the outbox. */
export const OutboxTrayIcon = fromPackage(Mails);
export const HourglassIcon = fromPackage(Hourglass);
/** A circle with a cross: stopped, refused, no longer usable. */
export const CrossCircleIcon = fromPackage(CircleX);
/** An arrow turning back: an order returned to whoever sent it. */
export const TurnBackIcon = fromPackage(Undo2);
/** A paper plane: a message that has gone. */
export const SentPlaneIcon = fromPackage(Send);
export const ClockIcon = fromPackage(Clock);
/** A triangle pointing right inside a circle: ready to start. */
export const StartCircleIcon = fromPackage(CirclePlay);
export const ChevronRightIcon = fromPackage(ChevronRight);
/** An eye with a slash: figures deliberately kept out of sight. */
export const HiddenEyeIcon = fromPackage(EyeOff);
export const OrderClipboardIcon = fromPackage(ClipboardList);
export const PatientCardIcon = fromPackage(IdCard);
export const MagnifierIcon = fromPackage(Search);
export const PaperclipIcon = fromPackage(Paperclip);
export const FileDownloadIcon = fromPackage(Download);
export const PageBackIcon = fromPackage(ChevronLeft);
export const PageForwardIcon = fromPackage(ChevronRight);
export const PrinterIcon = fromPackage(Printer);
/** An open eye: the treatment eye (the word "right" or "left" beside it says which). */
export const EyeIcon = fromPackage(Eye);
/** A single drop: a riboflavin drop given or due. */
export const DropletIcon = fromPackage(Droplet);
/** A loudspeaker with sound waves: cues will sound. */
export const SoundOnIcon = fromPackage(Volume2);
/** A loudspeaker with a cross: cues are silent (the flash still shows). */
export const SoundOffIcon = fromPackage(VolumeX);
/** Taps kept on this tablet, not yet stored by the server. */
export const UnsentIcon = fromPackage(CloudUpload);
/** Every tap stored by the server. */
export const StoredIcon = fromPackage(CloudCheck);
/** A square in a circle: end the step now. */
export const EndStepIcon = fromPackage(CircleStop);
/** A flag: something to follow up. */
export const FlagIcon = fromPackage(FlagTriangleRight);
/** A page of ruled lines: what was given, for the record. */
export const RecordLedgerIcon = fromPackage(FileText);
/** Columns of a chart: figures month by month. */
export const TrendBarsIcon = fromPackage(ChartColumn);
export const DeviceGaugeIcon = fromPackage(Gauge);
/** A clock turning back: who did what, and when. */
export const TrailLogIcon = fromPackage(History);
/** A closed envelope: a message to the patient. */
export const EnvelopeIcon = fromPackage(Mail);
/** A page with an arrow leaving it: the sheet the patient takes home. */
export const DischargeSheetIcon = fromPackage(FileOutput);

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

const sortGlyph = { asc: ChevronUp, desc: ChevronDown, none: ChevronsUpDown } as const;

/** A column's sort: up, down, or both (not sorted, and sortable). */
export function SortIcon({
  sortOrder,
  className = 'size-5',
  ...rest
}: IconProps & { sortOrder: 'asc' | 'desc' | false }) {
  const Glyph = sortGlyph[sortOrder || 'none'];
  return (
    <Glyph
      aria-hidden="true"
      focusable="false"
      className={`shrink-0 ${className}`}
      opacity={sortOrder ? 1 : 0.55}
      {...rest}
    />
  );
}

export function SpinnerIcon({ className = 'size-5', ...rest }: IconProps) {
  return (
    <LoaderCircle
      aria-hidden="true"
      focusable="false"
      className={`shrink-0 animate-spin ${className}`}
      {...rest}
    />
  );
}

/* Glyphs no package has, drawn for Luxtempo. */

export function MarkIcon({ className = 'size-8', ...rest }: IconProps) {
  return (
    <svg
      viewBox="0 0 32 32"
      aria-hidden="true"
      focusable="false"
      className={`shrink-0 ${className}`}
      {...rest}
    >
      <rect width="32" height="32" rx="8" fill="#512c95" />
      <circle cx="16" cy="16" r="9.5" fill="none" stroke="#faf8f5" strokeWidth="2.5" />
      <path d="M16 16V8.5A7.5 7.5 0 0 1 23.5 16Z" fill="#d6c9f2" />
      <circle cx="16" cy="16" r="2" fill="#faf8f5" />
    </svg>
  );
}

export function LightBeamIcon(props: IconProps) {
  return (
    <Icon {...props}>
      <rect x="2.5" y="9" width="7" height="6" rx="1.5" />
      <path d="M9.5 12h4" />
      <path d="M13.5 12l7-5M13.5 12l7 5M13.5 12h7" />
    </Icon>
  );
}

export function ShieldEyeIcon(props: IconProps) {
  return (
    <Icon {...props}>
      <path d="M12 3l7.5 3v5.5c0 4.5-3.2 8.2-7.5 9.5-4.3-1.3-7.5-5-7.5-9.5V6z" />
      <path d="M8 12.5s1.6-2.5 4-2.5 4 2.5 4 2.5-1.6 2.5-4 2.5-4-2.5-4-2.5z" />
      <circle cx="12" cy="12.5" r=".9" />
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

/** A ruler across a curve: the stroma measured in µm. */
export function ThicknessGaugeIcon(props: IconProps) {
  return (
    <Icon {...props}>
      <path d="M3 16.5c4-5 14-5 18 0" />
      <path d="M12 4v8.5M9.5 6.5L12 4l2.5 2.5M9.5 10L12 12.5 14.5 10" />
    </Icon>
  );
}

/** A screen with a small sun: the screen is kept awake. */
export function ScreenAwakeIcon(props: IconProps) {
  return (
    <Icon {...props}>
      <rect x="2.5" y="5" width="19" height="13" rx="2" />
      <circle cx="12" cy="11.5" r="2" />
      <path d="M12 7.5v.5M12 15v.5M8 11.5h.5M15.5 11.5h.5" />
      <path d="M9 21h6" />
    </Icon>
  );
}

/** A drop leaving a line with a warning mark: the infusion has leaked into the tissue. */
export function LeakIcon(props: IconProps) {
  return (
    <Icon {...props}>
      <path d="M3 7h9" />
      <path d="M12 7c2.8 3.3 4.5 5.8 4.5 8a4.5 4.5 0 0 1-9 0c0-2.2 1.7-4.7 4.5-8z" />
      <path d="M12 12v2.5M12 17h.01" />
    </Icon>
  );
}

/** Three rising bars, `level` of them solid: how severe a deviation is (1 minor, 2 major, 3 critical). */
export function SeverityLevelIcon({ level, ...props }: IconProps & { level: 1 | 2 | 3 }) {
  return (
    <Icon {...props}>
      <rect x="3.5" y="14" width="4" height="6" rx="1" fill="currentColor" />
      <rect
        x="10"
        y="9.5"
        width="4"
        height="10.5"
        rx="1"
        fill={level >= 2 ? 'currentColor' : 'none'}
      />
      <rect
        x="16.5"
        y="4"
        width="4"
        height="16"
        rx="1"
        fill={level >= 3 ? 'currentColor' : 'none'}
      />
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

/** A sun half hidden behind a shield: keep skin and eyes out of bright light. */
export function SunShieldIcon(props: IconProps) {
  return (
    <Icon {...props}>
      <circle cx="8" cy="8" r="3" />
      <path d="M8 2v1.2M2 8h1.2M3.8 3.8l.9.9M12.2 3.8l-.9.9M3.8 12.2l.9-.9" />
      <path d="M15.5 9.5l5 2v3.3c0 3-2.1 5.3-5 6.2-2.9-.9-5-3.2-5-6.2v-3.3z" />
    </Icon>
  );
}

/** Treatment lists, the pharmacy's stock, a lot's recall and the monthly drug use. */
export const ListCalendarIcon = fromPackage(CalendarDays);
export const StockBoxIcon = fromPackage(Package);
export const RecallSearchIcon = fromPackage(PackageSearch);
export const DrugUseBarsIcon = fromPackage(ChartBarStacked);
