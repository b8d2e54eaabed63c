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

export function SortIcon({
  sortOrder,
  ...props
}: IconProps & { sortOrder: 'asc' | 'desc' | false }) {
  return (
    <Icon {...props}>
      {sortOrder !== 'desc' && <path d="M8 10l4-4 4 4" opacity={sortOrder === 'asc' ? 1 : 0.45} />}
      {sortOrder !== 'asc' && <path d="M8 14l4 4 4-4" opacity={sortOrder === 'desc' ? 1 : 0.45} />}
    </Icon>
  );
}

export function SpinnerIcon({ className = 'size-5', ...rest }: IconProps) {
  return (
    <svg
      viewBox="0 0 24 24"
      aria-hidden="true"
      focusable="false"
      className={`shrink-0 animate-spin ${className}`}
      {...rest}
    >
      <circle
        cx="12"
        cy="12"
        r="9"
        fill="none"
        stroke="currentColor"
        strokeWidth="2.5"
        opacity="0.25"
      />
      <path
        d="M21 12a9 9 0 0 0-9-9"
        fill="none"
        stroke="currentColor"
        strokeWidth="2.5"
        strokeLinecap="round"
      />
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

/* The bedside step clock. */

/** A single drop: a riboflavin drop given or due. */
export function DropletIcon(props: IconProps) {
  return (
    <Icon {...props}>
      <path d="M12 3.5c3.5 4.4 6 7.9 6 10.9a6 6 0 0 1-12 0c0-3 2.5-6.5 6-10.9z" />
      <path d="M9.2 14.8a2.9 2.9 0 0 0 2.3 2.6" />
    </Icon>
  );
}

/** A loudspeaker with sound waves: cues will sound. */
export function SoundOnIcon(props: IconProps) {
  return (
    <Icon {...props}>
      <path d="M4 9.5h3.5L12 5.5v13l-4.5-4H4z" />
      <path d="M15.5 9a4.2 4.2 0 0 1 0 6M18.2 6.5a8 8 0 0 1 0 11" />
    </Icon>
  );
}

/** A loudspeaker with a cross: cues are silent (the flash still shows). */
export function SoundOffIcon(props: IconProps) {
  return (
    <Icon {...props}>
      <path d="M4 9.5h3.5L12 5.5v13l-4.5-4H4z" />
      <path d="M16 9.5l5 5M21 9.5l-5 5" />
    </Icon>
  );
}

/** An arrow waiting under a bar: taps kept on this tablet, not yet stored by the server. */
export function UnsentIcon(props: IconProps) {
  return (
    <Icon {...props}>
      <path d="M12 20V9" />
      <path d="M8 13l4-4 4 4" />
      <path d="M4 4.5h16" strokeDasharray="2.5 2.5" />
    </Icon>
  );
}

/** A stack with a tick: every tap stored by the server. */
export function StoredIcon(props: IconProps) {
  return (
    <Icon {...props}>
      <ellipse cx="11" cy="6" rx="7" ry="2.5" />
      <path d="M4 6v5.5c0 1.4 3.1 2.5 7 2.5M18 6v4" />
      <path d="M4 11.5V17c0 1.4 3.1 2.5 7 2.5" />
      <path d="M14 17.5l2.2 2.2 4.3-4.7" />
    </Icon>
  );
}

/** An open eye: the treatment eye. */
export function EyeIcon(props: IconProps) {
  return (
    <Icon {...props}>
      <path d="M2.5 12s3.5-6.5 9.5-6.5 9.5 6.5 9.5 6.5-3.5 6.5-9.5 6.5S2.5 12 2.5 12z" />
      <circle cx="12" cy="12" r="3" />
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

/** A circle with a bar: end the step now. */
export function EndStepIcon(props: IconProps) {
  return (
    <Icon {...props}>
      <circle cx="12" cy="12" r="9" />
      <rect x="8.5" y="8.5" width="7" height="7" rx="1" />
    </Icon>
  );
}

/* The auditor's screens. */

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

/** A flag on a pole: something to follow up. */
export function FlagIcon(props: IconProps) {
  return (
    <Icon {...props}>
      <path d="M5 21V4" />
      <path d="M5 4.5h11.5l-2.5 4 2.5 4H5" />
    </Icon>
  );
}

export function PrinterIcon(props: IconProps) {
  return (
    <Icon {...props}>
      <path d="M7 8.5V3.5h10v5" />
      <rect x="3" y="8.5" width="18" height="8" rx="2" />
      <rect x="7" y="13.5" width="10" height="7" rx="1" />
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

/** A page of ruled lines with figures: what was given, for the record. */
export function RecordLedgerIcon(props: IconProps) {
  return (
    <Icon {...props}>
      <rect x="4.5" y="3" width="15" height="18" rx="2" />
      <path d="M8 8h8M8 12h8M8 16h4" />
    </Icon>
  );
}

/** Bars of a chart over a base line: figures month by month. */
export function TrendBarsIcon(props: IconProps) {
  return (
    <Icon {...props}>
      <path d="M3 20.5h18" />
      <path d="M6 17v-4M10.5 17V8M15 17v-6M19.5 17V5" />
    </Icon>
  );
}

/** A list beside a small clock: who did what, and when. */
export function TrailLogIcon(props: IconProps) {
  return (
    <Icon {...props}>
      <path d="M3 5.5h8M3 10.5h6M3 15.5h5M3 20h9" />
      <circle cx="17" cy="13" r="5" />
      <path d="M17 10.5V13l1.6 1.2" />
    </Icon>
  );
}

/* Discharge. */

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

/** A closed envelope: a message to the patient. */
export function EnvelopeIcon(props: IconProps) {
  return (
    <Icon {...props}>
      <rect x="3" y="5.5" width="18" height="13" rx="2" />
      <path d="M3.5 7l8.5 6.5L20.5 7" />
    </Icon>
  );
}

/** A page with an arrow leaving it: the sheet the patient takes home. */
export function DischargeSheetIcon(props: IconProps) {
  return (
    <Icon {...props}>
      <path d="M14 21H6.5a1.5 1.5 0 0 1-1.5-1.5v-15A1.5 1.5 0 0 1 6.5 3H13l4 4v4" />
      <path d="M8.5 9h4M8.5 12.5h4" />
      <path d="M14.5 17h7M18.5 14l3 3-3 3" />
    </Icon>
  );
}
