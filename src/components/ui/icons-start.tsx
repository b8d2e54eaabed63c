import { ArrowLeft, Info, LoaderCircle, Lock, RotateCw, TriangleAlert } from 'lucide-react';
import { fromPackage, type IconProps } from './icon-base';

/**
 * The icons of the page every visit starts with: the start-up code's loading and error screens
 * and sign-in import from here (see ./icon-base.tsx).
 */

export const AlertIcon = fromPackage(TriangleAlert);
export const InfoIcon = fromPackage(Info);
export const LockIcon = fromPackage(Lock);
export const ArrowLeftIcon = fromPackage(ArrowLeft);
export const ReloadIcon = fromPackage(RotateCw);

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
