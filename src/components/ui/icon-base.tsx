import type { ReactNode, SVGProps } from 'react';
import type { LucideIcon } from 'lucide-react';

/**
 * The app's icons. Generic ones come from the icon package (lucide-react); the glyphs no
 * package has (the laser, eye protection, the vial, corneal thickness, the leak, severity
 * levels, the deviation path, light after the photosensitiser, the screen kept awake and the
 * mark) are drawn here in the same 24-unit, 2-stroke style. Icons are decorative: the word
 * beside an icon carries the meaning, so each one is hidden from assistive technology.
 *
 * Screens import icons from ./icons.tsx. The modules of the first pages import from smaller
 * modules that hold only their icons, so a first page does not download every screen's glyphs
 * (`npm run measure:bundle`): the start-up code and sign-in from ./icons-start.tsx, the
 * signed-in frame and Today from ./icons-first.tsx. Each re-exports the smaller one
 * (icons ⊃ icons-first ⊃ icons-start); a module of a first page that imports from a larger one
 * brings all of its glyphs into that page. This module holds what they share.
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
