export interface FieldProblem {
  path: string;
  message: string;
}

/** The one error type a service throws: a code, the HTTP status, and a message a person can act on. */
export class AppError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly fields?: FieldProblem[],
    /** Sent as Retry-After (seconds) with a 429 or 503. */
    readonly retryAfterS?: number,
  ) {
    super(message);
    this.name = 'AppError';
  }

  static badRequest(message: string, fields?: FieldProblem[]) {
    return new AppError(400, 'invalid_input', message, fields);
  }
  static unauthorised(message = 'Please sign in.') {
    return new AppError(401, 'not_signed_in', message);
  }
  static forbidden(message = 'Your roles do not allow this.') {
    return new AppError(403, 'forbidden', message);
  }
  static notFound(message: string) {
    return new AppError(404, 'not_found', message);
  }
  static conflict(code: string, message: string) {
    return new AppError(409, code, message);
  }
}
