import { z, type ZodError, type ZodType } from 'zod';
import { joinProblemMessages, speakFieldMessage } from '../../shared/format/field-labels';
import { AppError, type FieldProblem } from './app-error';

export function fieldProblemsFromZod(error: ZodError, prefix = ''): FieldProblem[] {
  return error.issues.map((issue) => {
    const path = [prefix, ...issue.path.map(String)].filter(Boolean).join('.') || 'body';
    return { path, message: issue.message };
  });
}

/**
 * Field problems as a person reads them (shared/format/field-labels.ts): each keeps its exact
 * path, for the screen to place it, and its message loses key names and internal paths.
 */
export function spokenProblems(fields: readonly FieldProblem[]): FieldProblem[] {
  return fields.map((f) => ({ path: f.path, message: speakFieldMessage(f.message) }));
}

/** A 400 naming every bad field of the request at once, in a person's words. */
export function badInput(fields: readonly FieldProblem[]): AppError {
  const spoken = spokenProblems(fields);
  return AppError.badRequest(joinProblemMessages(spoken.map((f) => f.message)), spoken);
}

/** Parses input at the edge with a shared schema; a failure is a 400 naming every bad field at once. */
export function parseInput<T>(schema: ZodType<T>, input: unknown, prefix = ''): T {
  const parsed = schema.safeParse(input);
  if (parsed.success) return parsed.data;
  throw badInput(fieldProblemsFromZod(parsed.error, prefix));
}

/** A numeric id from the URL. */
export const idParam = z.coerce
  .number({ error: 'id must be a whole number' })
  .int('id must be a whole number')
  .positive('id must be 1 or more')
  .max(4_294_967_295, 'id is too large');
