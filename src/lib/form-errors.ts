import type { FieldValues, Path, UseFormSetError } from 'react-hook-form';
import { speakFieldMessage } from '../../shared/format/field-labels';
import type { ApiRequestError } from './api-client';

/**
 * Shared schemas word their messages with the field's key ("displayName must be …") because
 * the API returns them too. Screens swap the key for the label the person sees: the shared field
 * table (shared/format/field-labels.ts) first, then the screen's own `labels`.
 */
export function readableMessage(
  message: string | undefined,
  labels: Record<string, string> = {},
): string | undefined {
  if (!message) return message;
  return speakFieldMessage(message, labels);
}

/**
 * Puts each field problem from a 400 answer beside its field. A path such as `roles.1` belongs
 * to the `roles` field.
 */
export function applyServerFieldErrors<T extends FieldValues>(
  error: ApiRequestError,
  setError: UseFormSetError<T>,
  fieldNames: readonly Path<T>[],
): void {
  let focused = false;
  for (const problem of error.fields) {
    const name = fieldNames.find((candidate) => candidate === fieldOf(problem.path));
    if (!name) continue;
    setError(name, { type: 'server', message: problem.message }, { shouldFocus: !focused });
    focused = true;
  }
}

/** Field problems that no field on this form can show; the form lists them in its alert. */
export function unplacedFieldProblems(
  error: ApiRequestError,
  fieldNames: readonly string[],
): string[] {
  return error.fields
    .filter((problem) => !fieldNames.includes(fieldOf(problem.path)))
    .map((problem) => problem.message);
}

function fieldOf(path: string): string {
  return path.split(/[.[]/)[0] ?? '';
}
