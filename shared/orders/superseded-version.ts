import { reasonOfSubstanceProblem } from './reason-of-substance';

/**
 * An order may use a protocol version that a newer approved version has superseded only with a
 * reason of substance (shared/orders/reason-of-substance.ts). Null when nothing is needed or the
 * reason given is one of substance; otherwise what to write, as a sentence.
 */
export function supersededVersionProblem(
  version: { key: string; version: number; supersededBy: number | null },
  reason: string | null | undefined,
): string | null {
  if (version.supersededBy === null) return null;
  const problem = reasonOfSubstanceProblem(reason);
  if (problem === null) return null;
  return `${version.key} version ${version.version} is superseded by version ${version.supersededBy}: to order with the older version, ${problem.replace('saying why treatment is still right', 'saying why the older version is right for this patient').replace('say why treatment is still right', 'say why the older version is right for this patient')}`;
}
