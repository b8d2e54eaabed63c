import type { z } from 'zod';

export interface FieldProblem {
  /** Dotted path of the offending field, e.g. `inputs.height.value`. */
  path: string;
  /** A sentence a person can act on: the field, the allowed range with units, the value got. */
  message: string;
}

/**
 * Raised when an input cannot be used: missing, not a number, or outside the protocol's hard
 * range. The engine never clamps a value into range; it refuses and says why.
 */
export class PlanInputError extends Error {
  override readonly name = 'PlanInputError';
  readonly fields: FieldProblem[];

  constructor(fields: FieldProblem[]) {
    super(fields.map((field) => field.message).join('; '));
    this.fields = fields;
  }
}

/** Turns zod issues into field problems, with paths prefixed the way the API names them. */
export function planInputErrorFromZod(error: z.ZodError, pathPrefix: string): PlanInputError {
  const joinPath = (parts: PropertyKey[]): string =>
    [pathPrefix, ...parts.map(String)].filter((part) => part !== '').join('.');
  return new PlanInputError(
    error.issues.flatMap((issue) =>
      // An unknown field is named by its own path, so the person sees which one to remove.
      issue.code === 'unrecognized_keys'
        ? issue.keys.map((key) => ({
            path: joinPath([...issue.path, key]),
            message: `${joinPath([...issue.path, key])} is not a field this calculation takes`,
          }))
        : [{ path: joinPath(issue.path), message: issue.message }],
    ),
  );
}
