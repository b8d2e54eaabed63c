import type { ReactNode, SVGProps } from 'react';

/**
 * Line icons drawn for Luxtempo. They are always decorative: the word beside an icon carries
 * the meaning, so each icon is hidden from assistive technology.
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

export function MarkIcon({ className = 'size-8', ...rest }: IconProps) {
  return (
    <svg viewBox="0 0 32 32" aria-hidden="true" focusable="false" className={`shrink-0 ${className}`} {...rest}>
      <rect width="32" height="32" rx="8" fill="#512c95" />
      <circle cx="16" cy="16" r="9.5" fill="none" stroke="#faf8f5" strokeWidth="2.5" />
      <path d="M16 16V8.5A7.5 7.5 0 0 1 23.5 16Z" fill="#d6c9f2" />
      <circle cx="16" cy="16" r="2" fill="#faf8f5" />
    </svg>
  );
}

export function SunriseIcon(props: IconProps) {
  return (
    <Icon {...props}>
      <path d="M3 18h18" />
      <path d="M7 18a5 5 0 0 1 10 0" />
      <path d="M12 4v3M4.9 9.9l2 2M19.1 9.9l-2 2" />
    </Icon>
  );
}

export function PeopleIcon(props: IconProps) {
  return (
    <Icon {...props}>
      <circle cx="9" cy="8" r="3.5" />
      <path d="M2.5 20a6.5 6.5 0 0 1 13 0" />
      <path d="M16 4.6a3.5 3.5 0 0 1 0 6.8" />
      <path d="M18.5 14.5a6.5 6.5 0 0 1 3 5.5" />
    </Icon>
  );
}

export function SignOutIcon(props: IconProps) {
  return (
    <Icon {...props}>
      <path d="M14 4h4a2 2 0 0 1 2 2v12a2 2 0 0 1-2 2h-4" />
      <path d="M10 16l-4-4 4-4" />
      <path d="M6 12h10" />
    </Icon>
  );
}

export function CheckCircleIcon(props: IconProps) {
  return (
    <Icon {...props}>
      <circle cx="12" cy="12" r="9" />
      <path d="M8 12.5l2.7 2.7L16 9.8" />
    </Icon>
  );
}

export function PauseCircleIcon(props: IconProps) {
  return (
    <Icon {...props}>
      <circle cx="12" cy="12" r="9" />
      <path d="M10 9v6M14 9v6" />
    </Icon>
  );
}

export function AlertIcon(props: IconProps) {
  return (
    <Icon {...props}>
      <path d="M12 3.5l9.5 16.5h-19z" />
      <path d="M12 10v4.5" />
      <path d="M12 17.5h.01" />
    </Icon>
  );
}

export function InfoIcon(props: IconProps) {
  return (
    <Icon {...props}>
      <circle cx="12" cy="12" r="9" />
      <path d="M12 11v5.5" />
      <path d="M12 7.5h.01" />
    </Icon>
  );
}

export function PlugOffIcon(props: IconProps) {
  return (
    <Icon {...props}>
      <path d="M9 3v4M15 3v4" />
      <path d="M6 7h12v3a6 6 0 0 1-6 6 6 6 0 0 1-6-6z" />
      <path d="M12 16v5" />
      <path d="M3 3l18 18" />
    </Icon>
  );
}

export function PlusIcon(props: IconProps) {
  return (
    <Icon {...props}>
      <path d="M12 5v14M5 12h14" />
    </Icon>
  );
}

export function PencilIcon(props: IconProps) {
  return (
    <Icon {...props}>
      <path d="M4 20h4L19 9a2.8 2.8 0 0 0-4-4L4 16z" />
      <path d="M13.5 6.5l4 4" />
    </Icon>
  );
}

export function LockIcon(props: IconProps) {
  return (
    <Icon {...props}>
      <rect x="5" y="10.5" width="14" height="10" rx="2" />
      <path d="M8 10.5V7a4 4 0 0 1 8 0v3.5" />
    </Icon>
  );
}

export function ArrowLeftIcon(props: IconProps) {
  return (
    <Icon {...props}>
      <path d="M19 12H5" />
      <path d="M11 6l-6 6 6 6" />
    </Icon>
  );
}

export function ReloadIcon(props: IconProps) {
  return (
    <Icon {...props}>
      <path d="M20 11a8 8 0 1 0-2.3 5.7" />
      <path d="M20 4v7h-7" />
    </Icon>
  );
}

export function SortIcon({ sortOrder, ...props }: IconProps & { sortOrder: 'asc' | 'desc' | false }) {
  return (
    <Icon {...props}>
      {sortOrder !== 'desc' && <path d="M8 10l4-4 4 4" opacity={sortOrder === 'asc' ? 1 : 0.45} />}
      {sortOrder !== 'asc' && <path d="M8 14l4 4 4-4" opacity={sortOrder === 'desc' ? 1 : 0.45} />}
    </Icon>
  );
}

export function SpinnerIcon({ className = 'size-5', ...rest }: IconProps) {
  return (
    <svg viewBox="0 0 24 24" aria-hidden="true" focusable="false" className={`shrink-0 animate-spin ${className}`} {...rest}>
      <circle cx="12" cy="12" r="9" fill="none" stroke="currentColor" strokeWidth="2.5" opacity="0.25" />
      <path d="M21 12a9 9 0 0 0-9-9" fill="none" stroke="currentColor" strokeWidth="2.5" strokeLinecap="round" />
    </svg>
  );
}

export function ProtocolBookIcon(props: IconProps) {
  return (
    <Icon {...props}>
      <path d="M5 4.5A1.5 1.5 0 0 1 6.5 3H19v15H6.5A1.5 1.5 0 0 0 5 19.5z" />
      <path d="M5 19.5A1.5 1.5 0 0 0 6.5 21H19v-3" />
      <path d="M9 7.5h6M9 11h4" />
    </Icon>
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

/** A circle of dashes: something not yet settled (a draft). */
export function DraftCircleIcon(props: IconProps) {
  return (
    <Icon {...props}>
      <path d="M12 3a9 9 0 0 1 4.5 1.2M19.8 7.5A9 9 0 0 1 21 12M19.8 16.5a9 9 0 0 1-3.3 3.3M12 21a9 9 0 0 1-4.5-1.2M4.2 16.5A9 9 0 0 1 3 12M4.2 7.5a9 9 0 0 1 3.3-3.3" />
      <path d="M9 12h6" />
    </Icon>
  );
}

export function ArchiveBoxIcon(props: IconProps) {
  return (
    <Icon {...props}>
      <rect x="3" y="4" width="18" height="4.5" rx="1" />
      <path d="M5 8.5V19a1 1 0 0 0 1 1h12a1 1 0 0 0 1-1V8.5" />
      <path d="M10 12.5h4" />
    </Icon>
  );
}

export function UploadIcon(props: IconProps) {
  return (
    <Icon {...props}>
      <path d="M12 15V4" />
      <path d="M7.5 8.5L12 4l4.5 4.5" />
      <path d="M4 15v3.5A1.5 1.5 0 0 0 5.5 20h13a1.5 1.5 0 0 0 1.5-1.5V15" />
    </Icon>
  );
}

export function CopyDraftIcon(props: IconProps) {
  return (
    <Icon {...props}>
      <rect x="8.5" y="8.5" width="12" height="12" rx="2" />
      <path d="M15.5 8.5V5a1.5 1.5 0 0 0-1.5-1.5H5A1.5 1.5 0 0 0 3.5 5v9A1.5 1.5 0 0 0 5 15.5h3.5" />
      <path d="M14.5 12v5M12 14.5h5" />
    </Icon>
  );
}

export function SideBySideIcon(props: IconProps) {
  return (
    <Icon {...props}>
      <rect x="3" y="4" width="7.5" height="16" rx="1.5" />
      <rect x="13.5" y="4" width="7.5" height="16" rx="1.5" />
      <path d="M5.5 9h2.5M5.5 12.5h2.5M16 9h2.5M16 12.5h2.5" />
    </Icon>
  );
}

export function MinusIcon(props: IconProps) {
  return (
    <Icon {...props}>
      <path d="M5 12h14" />
    </Icon>
  );
}

/** Two opposed arrows: a value that was replaced by another. */
export function SwapIcon(props: IconProps) {
  return (
    <Icon {...props}>
      <path d="M4 8h14l-3.5-3.5" />
      <path d="M20 16H6l3.5 3.5" />
    </Icon>
  );
}

export function EqualsIcon(props: IconProps) {
  return (
    <Icon {...props}>
      <path d="M6 9.5h12M6 14.5h12" />
    </Icon>
  );
}

export function SignatureIcon(props: IconProps) {
  return (
    <Icon {...props}>
      <path d="M3 17c2.5-4 4.5-9 6-9 2 0-1.5 9 1 9 1.5 0 2.5-3 4-3 1.2 0 1 2 2.5 2H21" />
      <path d="M3 21h18" />
    </Icon>
  );
}

export function SigmaIcon(props: IconProps) {
  return (
    <Icon {...props}>
      <path d="M17 5H7l5.5 7L7 19h10" />
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

/** A tray with an arrow leaving it: messages waiting to go out. */
export function OutboxTrayIcon(props: IconProps) {
  return (
    <Icon {...props}>
      <path d="M3.5 13.5h4.5l1.5 2.5h5l1.5-2.5h4.5" />
      <path d="M3.5 13.5V19a1 1 0 0 0 1 1h15a1 1 0 0 0 1-1v-5.5L18 8h-2.5M6 8h2.5L3.5 13.5" />
      <path d="M12 12V3M8.5 6.5L12 3l3.5 3.5" />
    </Icon>
  );
}

export function HourglassIcon(props: IconProps) {
  return (
    <Icon {...props}>
      <path d="M6 3h12M6 21h12" />
      <path d="M7.5 3v3.5L12 12l4.5-5.5V3M7.5 21v-3.5L12 12l4.5 5.5V21" />
    </Icon>
  );
}

/** A circle with a cross: stopped, refused, no longer usable. */
export function CrossCircleIcon(props: IconProps) {
  return (
    <Icon {...props}>
      <circle cx="12" cy="12" r="9" />
      <path d="M9 9l6 6M15 9l-6 6" />
    </Icon>
  );
}

/** An arrow turning back: an order returned to whoever sent it. */
export function TurnBackIcon(props: IconProps) {
  return (
    <Icon {...props}>
      <path d="M9 14L4 9l5-5" />
      <path d="M4 9h10.5a5.5 5.5 0 0 1 0 11H11" />
    </Icon>
  );
}

/** A paper plane: a message that has gone. */
export function SentPlaneIcon(props: IconProps) {
  return (
    <Icon {...props}>
      <path d="M21 3L10 14" />
      <path d="M21 3l-6.5 18-4.5-7-7-4.5z" />
    </Icon>
  );
}

export function ClockIcon(props: IconProps) {
  return (
    <Icon {...props}>
      <circle cx="12" cy="12" r="9" />
      <path d="M12 7v5l3 2" />
    </Icon>
  );
}

/** A triangle pointing right inside a circle: ready to start. */
export function StartCircleIcon(props: IconProps) {
  return (
    <Icon {...props}>
      <circle cx="12" cy="12" r="9" />
      <path d="M10 8.5v7l5.5-3.5z" />
    </Icon>
  );
}

export function ChevronRightIcon(props: IconProps) {
  return (
    <Icon {...props}>
      <path d="M9 5l7 7-7 7" />
    </Icon>
  );
}

/** A closed eye with a slash: figures deliberately kept out of sight. */
export function HiddenEyeIcon(props: IconProps) {
  return (
    <Icon {...props}>
      <path d="M3 12s3.5-6 9-6c1.6 0 3 .5 4.2 1.2M21 12s-3.5 6-9 6c-1.6 0-3-.5-4.2-1.2" />
      <path d="M9.5 14.5a3.5 3.5 0 0 1 5-5" />
      <path d="M4 20L20 4" />
    </Icon>
  );
}

/* Orders and patients. */

export function OrderClipboardIcon(props: IconProps) {
  return (
    <Icon {...props}>
      <rect x="5" y="4.5" width="14" height="16.5" rx="2" />
      <path d="M9 4.5V3.5A1 1 0 0 1 10 2.5h4a1 1 0 0 1 1 1v1" />
      <path d="M8.5 10h7M8.5 13.5h7M8.5 17h4" />
    </Icon>
  );
}

export function PatientCardIcon(props: IconProps) {
  return (
    <Icon {...props}>
      <rect x="2.5" y="5" width="19" height="14" rx="2" />
      <circle cx="8.5" cy="11" r="2.3" />
      <path d="M5 16.5a3.5 3.5 0 0 1 7 0" />
      <path d="M14.5 10h4M14.5 13.5h3" />
    </Icon>
  );
}

export function MagnifierIcon(props: IconProps) {
  return (
    <Icon {...props}>
      <circle cx="10.5" cy="10.5" r="6.5" />
      <path d="M15.5 15.5L21 21" />
    </Icon>
  );
}

export function PaperclipIcon(props: IconProps) {
  return (
    <Icon {...props}>
      <path d="M20 11.5l-7.8 7.8a5 5 0 0 1-7.1-7.1l8.5-8.5a3.3 3.3 0 0 1 4.7 4.7l-8.5 8.5a1.7 1.7 0 0 1-2.4-2.4L15 6.8" />
    </Icon>
  );
}

export function FileDownloadIcon(props: IconProps) {
  return (
    <Icon {...props}>
      <path d="M12 4v11" />
      <path d="M7.5 10.5L12 15l4.5-4.5" />
      <path d="M4 17v1.5A1.5 1.5 0 0 0 5.5 20h13a1.5 1.5 0 0 0 1.5-1.5V17" />
    </Icon>
  );
}

export function PageBackIcon(props: IconProps) {
  return (
    <Icon {...props}>
      <path d="M14.5 6l-6 6 6 6" />
    </Icon>
  );
}

export function PageForwardIcon(props: IconProps) {
  return (
    <Icon {...props}>
      <path d="M9.5 6l6 6-6 6" />
    </Icon>
  );
}

/** An arrow curling back: an order sent back to the clinician. */
export function StatusReturnedIcon(props: IconProps) {
  return (
    <Icon {...props}>
      <path d="M9 14L4 9l5-5" />
      <path d="M4 9h10.5a5.5 5.5 0 0 1 0 11H11" />
    </Icon>
  );
}

/** Two ticks: a figure checked by a second person. */
export function StatusCheckedIcon(props: IconProps) {
  return (
    <Icon {...props}>
      <path d="M2.5 12.5l4 4L14 9" />
      <path d="M10.5 16.5L18 9" />
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

/** A clock face with a moving hand: the session is running. */
export function StatusInSessionIcon(props: IconProps) {
  return (
    <Icon {...props}>
      <circle cx="12" cy="12" r="9" />
      <path d="M12 7v5l3.5 2" />
    </Icon>
  );
}

/** A flag: the treatment was given in full. */
export function StatusCompletedIcon(props: IconProps) {
  return (
    <Icon {...props}>
      <path d="M5 21V4" />
      <path d="M5 4h11l-2 4 2 4H5" />
    </Icon>
  );
}

/** An octagon with a bar: the session was stopped before the end. */
export function StatusStoppedIcon(props: IconProps) {
  return (
    <Icon {...props}>
      <path d="M8.3 3h7.4L21 8.3v7.4L15.7 21H8.3L3 15.7V8.3z" />
      <path d="M8 12h8" />
    </Icon>
  );
}
