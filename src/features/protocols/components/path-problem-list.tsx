import type { FieldProblem } from '../../../lib/api-client';

/**
 * Validation problems from the server, each with the JSON path it concerns, so the person can
 * find the value in the file or the text.
 */
export function PathProblemList({
  problems,
  stripPrefix = '',
}: {
  problems: FieldProblem[];
  stripPrefix?: string;
}) {
  return (
    <ul className="mt-1 space-y-1.5">
      {problems.map((problem, index) => {
        const path =
          stripPrefix && problem.path.startsWith(stripPrefix)
            ? problem.path.slice(stripPrefix.length) || '(the whole definition)'
            : problem.path;
        return (
          <li key={`${problem.path}-${index}`} className="flex flex-wrap gap-x-2">
            <code className="rounded bg-white px-1.5 py-0.5 font-mono text-sm text-paper-950 ring-1 ring-alarm-200 [overflow-wrap:anywhere]">
              {path}
            </code>
            <span>{problem.message}</span>
          </li>
        );
      })}
    </ul>
  );
}
