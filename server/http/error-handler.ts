import type { ErrorRequestHandler } from 'express';
import { ZodError } from 'zod';
import { AppError } from './app-error';
import { fieldProblemsFromZod } from './validation';

const databaseDownCodes = new Set([
  'ECONNREFUSED',
  'PROTOCOL_CONNECTION_LOST',
  'ETIMEDOUT',
  'ECONNRESET',
  'ER_CON_COUNT_ERROR',
  'EPIPE',
  'ER_SERVER_SHUTDOWN',
  'ER_CONNECTION_KILLED',
  // A Galera node cut off from the others, or still joining, refuses every query (1047) until it
  // is a synced member of the primary component again; HAProxy moves to another node meanwhile.
  'ER_UNKNOWN_COM_ERROR',
  // Two Galera nodes wrote the same rows at once: the later commit is refused and rolled back.
  'ER_LOCK_DEADLOCK',
]);

/**
 * The one error middleware. It answers every failure with `{ error: { code, message, fields? } }`
 * and never leaks a stack trace or SQL to the client.
 */
export const errorHandler: ErrorRequestHandler = (err, _req, res, _next) => {
  if (err instanceof AppError) {
    if (err.retryAfterS !== undefined)
      res.setHeader('Retry-After', String(Math.max(1, Math.ceil(err.retryAfterS))));
    res.status(err.status).json({
      error: {
        code: err.code,
        message: err.message,
        ...(err.fields ? { fields: err.fields } : {}),
      },
    });
    return;
  }
  if (err instanceof ZodError) {
    const fields = fieldProblemsFromZod(err);
    res.status(400).json({
      error: { code: 'invalid_input', message: fields.map((f) => f.message).join('; '), fields },
    });
    return;
  }
  // Body parser failures: unreadable JSON or a body over the size limit.
  const status =
    typeof err?.status === 'number'
      ? err.status
      : typeof err?.statusCode === 'number'
        ? err.statusCode
        : 0;
  if (err?.type === 'entity.parse.failed') {
    res.status(400).json({
      error: {
        code: 'invalid_json',
        message: 'The request body is not valid JSON.',
        fields: [{ path: 'body', message: 'body must be valid JSON' }],
      },
    });
    return;
  }
  if (err?.type === 'entity.too.large') {
    res
      .status(413)
      .json({ error: { code: 'too_large', message: 'The request body is too large.' } });
    return;
  }
  if (err?.name === 'MulterError') {
    const tooLarge = err.code === 'LIMIT_FILE_SIZE';
    res.status(tooLarge ? 413 : 400).json({
      error: {
        code: tooLarge ? 'too_large' : 'invalid_upload',
        message: tooLarge ? 'The file is larger than allowed.' : 'The upload could not be read.',
        fields: [{ path: err.field ?? 'file', message: String(err.message) }],
      },
    });
    return;
  }
  if (status >= 400 && status < 500) {
    res
      .status(status)
      .json({ error: { code: 'bad_request', message: 'The request could not be read.' } });
    return;
  }
  const code = err?.code ?? err?.driverError?.code;
  if (databaseDownCodes.has(code)) {
    res.status(503).json({
      error: {
        code: 'database_unavailable',
        message: 'The database is not answering. Nothing was saved; try again in a moment.',
      },
    });
    return;
  }
  // A database trigger kept a signed or closed record as it was (SIGNAL SQLSTATE '45000'): the
  // API should have refused first, so it is logged, but the person hears why nothing changed.
  if (code === 'ER_SIGNAL_EXCEPTION') {
    console.error(
      'A database rule refused a change:',
      err?.sqlMessage ?? err?.driverError?.sqlMessage,
    );
    res.status(409).json({
      error: {
        code: 'record_kept',
        message: `${err?.sqlMessage ?? err?.driverError?.sqlMessage ?? 'The record cannot be changed.'} Nothing was saved.`,
      },
    });
    return;
  }
  console.error('Unexpected error:', err);
  res.status(500).json({
    error: {
      code: 'internal',
      message: 'Something went wrong on the server. Nothing more was saved; please try again.',
    },
  });
};
