import type { ProtocolVersion } from '../../../../shared/protocol/protocol-schema';
import { CheckCircleIcon, InfoIcon, PeopleIcon } from '../../../components/ui/icons';
import { ParameterSection } from './parameter-list';
import { supportsInPlainWords } from './protocol-field-labels';

type SourceStatus = ProtocolVersion['sources'][number]['status'];

const standing: Record<
  SourceStatus,
  { word: string; explain: string; Icon: typeof CheckCircleIcon; box: string }
> = {
  published: {
    word: 'Published',
    explain: 'read in the publication',
    Icon: CheckCircleIcon,
    box: 'border-iris-300 bg-iris-50 text-iris-800',
  },
  memory: {
    word: 'From memory',
    explain: 'recalled, not checked against a text',
    Icon: InfoIcon,
    box: 'border-dashed border-paper-500 bg-white text-paper-800',
  },
  practice: {
    word: 'Common practice',
    explain: 'no single source',
    Icon: PeopleIcon,
    box: 'border-paper-300 bg-paper-100 text-paper-800',
  },
};

/** Each citation with how firmly it stands, so a reviewer knows which figures still need checking. */
export function SourcesList({ sources }: { sources: ProtocolVersion['sources'] }) {
  const counts = sources.reduce<Record<SourceStatus, number>>(
    (acc, s) => ({ ...acc, [s.status]: acc[s.status] + 1 }),
    { published: 0, memory: 0, practice: 0 },
  );
  return (
    <ParameterSection
      id="params-sources"
      title="Sources"
      lead={`${sources.length} in all: ${counts.published} published, ${counts.memory} from memory, ${counts.practice} common practice. Figures resting on memory or practice need checking against your own references.`}
    >
      <ol className="divide-y divide-paper-200">
        {sources.map((source) => {
          const { word, explain, Icon, box } = standing[source.status];
          return (
            <li key={source.id} className="flex flex-col gap-2 py-4 first:pt-1 last:pb-0">
              <div className="flex flex-wrap items-center gap-x-3 gap-y-1">
                <span
                  className={`inline-flex items-center gap-1.5 rounded-full border px-2.5 py-0.5 text-sm font-medium ${box}`}
                >
                  <Icon className="size-4" />
                  {word}
                  <span className="sr-only">: {explain}</span>
                </span>
                <code className="font-mono text-sm text-paper-700">{source.id}</code>
              </div>
              <p className="text-paper-950">{source.citation}</p>
              <p className="text-sm text-paper-700">
                <span className="font-medium text-paper-800">Supports: </span>
                {supportsInPlainWords(source.supports)}
              </p>
            </li>
          );
        })}
      </ol>
    </ParameterSection>
  );
}
