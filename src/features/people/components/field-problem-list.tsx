import { readableMessage } from '../../../lib/form-errors';

/** Server problems about fields this form does not show, so they are not silently lost. */
export function FieldProblemList({
  problems,
  labels,
}: {
  problems: string[];
  labels: Record<string, string>;
}) {
  return (
    <ul className="list-disc pl-5">
      {problems.map((problem) => (
        <li key={problem}>{readableMessage(problem, labels)}</li>
      ))}
    </ul>
  );
}
