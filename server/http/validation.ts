import { z, type ZodError, type ZodType } from 'zod';
import { AppError, type FieldProblem } from './app-error';

export function fieldProblemsFromZod(error: ZodError, prefix = ''): FieldProblem[] {
  return error.issues.map((issue) => {
    const path = [prefix, ...issue.path.map(String)].filter(Boolean).join('.') || 'body';
    return { path, message: issue.message };
  });
}

/** Parses input at the edge with a shared schema; a failure is a 400 naming each field. */
export function parseInput<T>(schema: ZodType<T>, input: unknown, prefix = ''): T {
  const parsed = schema.safeParse(input);
  if (parsed.success) return parsed.data;
  const fields = fieldProblemsFromZod(parsed.error, prefix);
  throw AppError.badRequest(fields.map((f) => `${f.path}: ${f.message}`).join('; '), fields);
}

/** A numeric id from the URL. */
export const idParam = z.coerce
  .number({ error: 'id must be a whole number' })
  .int('id must be a whole number')
  .positive('id must be 1 or more')
  .max(4_294_967_295, 'id is too large');
