import type { ReactNode, SVGProps } from 'react';
import type { LucideIcon } from 'lucide-react';

/**
 * The app's icons. Generic ones come from the icon package (lucide-react); the glyphs no
 * package has (the laser, eye protection, the vial, corneal thickness, the leak, severity
 * levels, the deviation path, light after the photosensitiser, the screen kept awake and the
 * mark) are drawn here in the same 24-unit, 2-stroke style. Icons are decorative: the word
 * beside an icon carries the meaning, so each one is hidden from assistive technology.
 *
 * Screens import icons from ./icons.tsx. The modules of the first page (the start-up code,
 * sign-in, the signed-in frame and Today) import from ./icons-first.tsx instead, which holds
 * only their icons, so the first page does not download every screen's glyphs
 * (`npm run measure:bundle`). This module holds what both share.
 */
export type IconProps = Omit<SVGProps<SVGSVGElement>, 'children'>;

export function Icon({
  className = 'size-5',
  children,
  ...rest
}: IconProps & { children: ReactNode }) {
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
export function fromPackage(Glyph: LucideIcon) {
  function PackageIcon({ className = 'size-5', ...rest }: IconProps) {
    return (
      <Glyph aria-hidden="true" focusable="false" className={`shrink-0 ${className}`} {...rest} />
    );
  }
  return PackageIcon;
}
