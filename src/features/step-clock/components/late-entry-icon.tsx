import { Icon, type IconProps } from '../../../components/ui/icon-base';

/** A clock face with an arrow turning back: a tap entered afterwards at its real time. Decorative. */
export function LateEntryIcon(props: IconProps) {
  return (
    <Icon {...props}>
      <path d="M3.5 12a8.5 8.5 0 1 0 2.5-6" />
      <path d="M3 3.5v4h4" />
      <path d="M12 7.5V12l3 2" />
    </Icon>
  );
}
