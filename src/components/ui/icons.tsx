import {
  ChevronDown,
  ChevronLeft,
  ChevronRight,
  ChevronsUpDown,
  ChevronUp,
  CirclePause,
  CirclePlay,
  CircleStop,
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
  FlagTriangleRight,
  Mail,
  Minus,
  Paperclip,
  Pencil,
  Plus,
  Printer,
  Search,
  Send,
  Sigma,
  Undo2,
  Upload,
  Volume2,
  VolumeX,
} from 'lucide-react';
import { Icon, fromPackage, type IconProps } from './icon-base';

/** The app's icons (see ./icon-base.tsx); the first page's own are in ./icons-first.tsx. */
export * from './icons-first';

export const PauseCircleIcon = fromPackage(CirclePause);
export const PlusIcon = fromPackage(Plus);
export const PencilIcon = fromPackage(Pencil);
export const UploadIcon = fromPackage(Upload);
export const CopyDraftIcon = fromPackage(CopyPlus);
export const SideBySideIcon = fromPackage(Columns2);
export const MinusIcon = fromPackage(Minus);
export const EqualsIcon = fromPackage(Equal);
export const SigmaIcon = fromPackage(Sigma);
/** An arrow turning back: an order returned to whoever sent it. */
export const TurnBackIcon = fromPackage(Undo2);
/** A paper plane: a message that has gone. */
export const SentPlaneIcon = fromPackage(Send);
/** A triangle pointing right inside a circle: ready to start. */
export const StartCircleIcon = fromPackage(CirclePlay);
/** An eye with a slash: figures deliberately kept out of sight. */
export const HiddenEyeIcon = fromPackage(EyeOff);
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
/** A closed envelope: a message to the patient. */
export const EnvelopeIcon = fromPackage(Mail);
/** A page with an arrow leaving it: the sheet the patient takes home. */
export const DischargeSheetIcon = fromPackage(FileOutput);

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

export function ShieldEyeIcon(props: IconProps) {
  return (
    <Icon {...props}>
      <path d="M12 3l7.5 3v5.5c0 4.5-3.2 8.2-7.5 9.5-4.3-1.3-7.5-5-7.5-9.5V6z" />
      <path d="M8 12.5s1.6-2.5 4-2.5 4 2.5 4 2.5-1.6 2.5-4 2.5-4-2.5-4-2.5z" />
      <circle cx="12" cy="12.5" r=".9" />
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
