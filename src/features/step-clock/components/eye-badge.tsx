import type { Eye } from '../../../../shared/schemas/patients';
import { EyeIcon } from '../../../components/ui/icons';

export const eyeWords: Record<Eye, string> = { right: 'right eye', left: 'left eye' };

/** The treatment eye in capitals and words, never by colour or side of the screen alone. */
export function EyeBadge({ eye, size = 'large' }: { eye: Eye; size?: 'huge' | 'large' }) {
  const huge = size === 'huge';
  return (
    <p
      data-eye-badge
      className={`inline-flex max-w-full items-center gap-3 rounded-2xl border-4 border-paper-900 bg-white font-bold tracking-wide text-paper-950 ${huge ? 'px-6 py-3' : 'px-3 py-0.5'}`}
    >
      <EyeIcon className={huge ? 'size-14' : 'size-7'} />
      {/* Half the screen is its column on a tablet: sized to the viewport so it never spills out of it. */}
      <span
        className={
          huge
            ? 'text-[clamp(2.5rem,5.5vw,6rem)] leading-none font-semibold'
            : 'text-2xl leading-none'
        }
      >
        {eye === 'right' ? 'RIGHT' : 'LEFT'}
        <span className={huge ? 'ml-3 text-4xl' : 'ml-1.5 text-lg'}>EYE</span>
      </span>
    </p>
  );
}
