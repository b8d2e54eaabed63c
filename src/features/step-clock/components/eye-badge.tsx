import type { Eye } from '../../../../shared/schemas/patients';
import { EyeIcon } from '../../../components/ui/icons';

export const eyeWords: Record<Eye, string> = { right: 'right eye', left: 'left eye' };

/** The treatment eye in capitals and words, never by colour or side of the screen alone. */
export function EyeBadge({ eye, size = 'large' }: { eye: Eye; size?: 'huge' | 'large' }) {
  const huge = size === 'huge';
  return (
    <p className={`inline-flex items-center gap-3 rounded-2xl border-4 border-paper-900 bg-white font-bold tracking-wide text-paper-950 ${huge ? 'px-6 py-3' : 'px-3 py-0.5'}`}>
      <EyeIcon className={huge ? 'size-14' : 'size-7'} />
      <span className={huge ? 'text-clock-sm leading-none' : 'text-2xl leading-none'}>
        {eye === 'right' ? 'RIGHT' : 'LEFT'}
        <span className={huge ? 'ml-3 text-4xl' : 'ml-1.5 text-lg'}>EYE</span>
      </span>
    </p>
  );
}
