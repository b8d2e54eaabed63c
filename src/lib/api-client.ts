/**
 * The one way the client talks to the Luxtempo API. Every call goes to `/api/...` on the same
 * origin with the session cookie, sends JSON (or multipart form data for uploads) and reads
 * JSON, and turns every failure — a refused request, an unreachable server, an answer in an
 * unexpected shape — into one `ApiRequestError` that screens can show beside a field or in an
 * alert.
 */

export type FieldProblem = { path: string; message: string };

/** Anything with a zod-style `parse`; keeps this module free of a schema library import. */
export type ResponseParser<T> = { parse: (data: unknown) => T };

/**
 * A parser whose module (and schema library) loads on demand: the request starts it together
 * with the fetch, so a screen's first load does not carry the schemas of the answers it waits for.
 */
export type LoadedParser<T> = { load: () => Promise<ResponseParser<T>> };

/** `schema` for a request, loaded with it: `lazySchema(() => import('…').then((m) => m.schema))`. */
export function lazySchema<T>(load: () => Promise<ResponseParser<T>>): LoadedParser<T> {
  let loading: Promise<ResponseParser<T>> | undefined;
  return {
    load: () => {
      // A failed load (a dropped network) is tried again on the next request, not kept.
      loading ??= load().catch((error: unknown) => {
        loading = undefined;
        throw error;
      });
      return loading;
    },
  };
}

export class ApiRequestError extends Error {
  /** HTTP status; 0 when no answer came back at all. */
  readonly status: number;
  readonly code: string;
  readonly fields: FieldProblem[];
  /** Seconds the server asked us to wait (Retry-After), when it said. */
  readonly retryAfterS: number | null;

  constructor(init: {
    status: number;
    code: string;
    message: string;
    fields?: FieldProblem[];
    retryAfterS?: number | null;
  }) {
    super(init.message);
    this.name = 'ApiRequestError';
    this.status = init.status;
    this.code = init.code;
    this.fields = init.fields ?? [];
    this.retryAfterS = init.retryAfterS ?? null;
  }
}

export function isApiRequestError(error: unknown): error is ApiRequestError {
  return error instanceof ApiRequestError;
}

/** A message a person can act on, whatever was thrown. */
export function describeError(error: unknown): string {
  if (isApiRequestError(error)) return error.message;
  return 'Something unexpected went wrong. Try again, and tell your administrator if it keeps happening.';
}

let onUnauthorized: ((error: ApiRequestError) => void) | null = null;

/**
 * The app registers what happens when the server says the session is gone (401): it clears the
 * session so the sign-in screen shows. Registered from outside so this module knows no feature.
 */
export function setUnauthorizedHandler(handler: ((error: ApiRequestError) => void) | null): void {
  onUnauthorized = handler;
}

type Method = 'GET' | 'POST' | 'PATCH' | 'PUT' | 'DELETE';

export type RequestOptions<T> = {
  method?: Method;
  /** Sent as JSON; a `FormData` is sent as multipart form data instead (uploads). */
  body?: unknown;
  /** Validates the success body; without it the body is returned unchecked. */
  schema?: ResponseParser<T> | LoadedParser<T>;
  signal?: AbortSignal;
  /**
   * A 401 normally means the session ended and signs the person out. Sign-in itself answers 401
   * for a wrong password, which must stay on the form instead.
   */
  unauthorized?: 'end-session' | 'report';
  /** Sees the answer's headers before the body is read (e.g. whether it is an offline copy). */
  onHeaders?: (headers: Headers) => void;
};

const API_PREFIX = '/api';

export async function apiRequest<T>(path: string, options: RequestOptions<T> = {}): Promise<T> {
  const { method = 'GET', body, schema, signal, unauthorized = 'end-session', onHeaders } = options;
  const headers: Record<string, string> = { Accept: 'application/json' };
  // The browser writes a multipart body's Content-Type itself, with the boundary in it.
  const multipart = typeof FormData !== 'undefined' && body instanceof FormData;
  if (body !== undefined && !multipart) headers['Content-Type'] = 'application/json';
  const parser = schema && 'load' in schema ? schema.load() : schema;
  // Awaited after the answer; a failure before then must not also surface as unhandled.
  if (parser instanceof Promise) parser.catch(() => undefined);

  let response: Response;
  try {
    response = await fetch(`${API_PREFIX}${path}`, {
      method,
      headers,
      body: body === undefined ? undefined : multipart ? body : JSON.stringify(body),
      credentials: 'same-origin',
      signal,
    });
  } catch (cause) {
    // Cancellation is not a failure; TanStack Query expects the abort to pass through.
    if (cause instanceof DOMException && cause.name === 'AbortError') throw cause;
    throw new ApiRequestError({
      status: 0,
      code: 'network_unreachable',
      message:
        'The Luxtempo server could not be reached. Check the network connection and try again.',
    });
  }

  onHeaders?.(response.headers);
  const payload = await readJson(response);

  if (!response.ok) {
    const error = toRequestError(response, payload);
    if (response.status === 401 && unauthorized === 'end-session') onUnauthorized?.(error);
    throw error;
  }

  if (response.status === 204 || payload === undefined) {
    if (schema) throw unexpectedShape(response.status);
    return undefined as T;
  }
  if (!parser) return payload as T;
  const parse = await parser;
  try {
    return parse.parse(payload);
  } catch {
    throw unexpectedShape(response.status);
  }
}

export const api = {
  get: <T>(path: string, options?: Omit<RequestOptions<T>, 'method' | 'body'>) =>
    apiRequest<T>(path, { ...options, method: 'GET' }),
  post: <T>(path: string, body?: unknown, options?: Omit<RequestOptions<T>, 'method' | 'body'>) =>
    apiRequest<T>(path, { ...options, method: 'POST', body }),
  put: <T>(path: string, body: unknown, options?: Omit<RequestOptions<T>, 'method' | 'body'>) =>
    apiRequest<T>(path, { ...options, method: 'PUT', body }),
  patch: <T>(path: string, body: unknown, options?: Omit<RequestOptions<T>, 'method' | 'body'>) =>
    apiRequest<T>(path, { ...options, method: 'PATCH', body }),
  /** Posts files as multipart form data; errors and a 401 are handled as for every other call. */
  upload: <T>(
    path: string,
    formData: FormData,
    options?: Omit<RequestOptions<T>, 'method' | 'body'>,
  ) => apiRequest<T>(path, { ...options, method: 'POST', body: formData }),
  delete: <T = void>(path: string, options?: Omit<RequestOptions<T>, 'method' | 'body'>) =>
    apiRequest<T>(path, { ...options, method: 'DELETE' }),
};

async function readJson(response: Response): Promise<unknown> {
  if (response.status === 204) return undefined;
  const text = await response.text().catch(() => '');
  if (text.trim() === '') return undefined;
  try {
    return JSON.parse(text) as unknown;
  } catch {
    return undefined;
  }
}

function toRequestError(response: Response, payload: unknown): ApiRequestError {
  const retryAfterS = parseRetryAfter(response.headers.get('Retry-After'));
  const body = readErrorBody(payload);
  if (body) return new ApiRequestError({ status: response.status, ...body, retryAfterS });
  // A proxy or crashed server answers without our error body; say what a person can do.
  return new ApiRequestError({
    status: response.status,
    code: `http_${response.status}`,
    message: fallbackMessage(response.status),
    retryAfterS,
  });
}

function readErrorBody(
  payload: unknown,
): { code: string; message: string; fields: FieldProblem[] } | null {
  if (!isRecord(payload) || !isRecord(payload.error)) return null;
  const { code, message, fields } = payload.error;
  if (typeof code !== 'string' || typeof message !== 'string') return null;
  const cleanFields = Array.isArray(fields)
    ? fields.filter(
        (f): f is FieldProblem =>
          isRecord(f) && typeof f.path === 'string' && typeof f.message === 'string',
      )
    : [];
  return { code, message, fields: cleanFields };
}

function fallbackMessage(status: number): string {
  if (status === 401) return 'Your session has ended. Sign in again to continue.';
  if (status === 403) return 'Your roles do not allow this.';
  if (status === 404) return 'This was not found. It may have been removed.';
  if (status === 413) return 'What was sent is larger than the server accepts.';
  if (status === 415) return 'The server does not accept this kind of file.';
  if (status === 429) return 'Too many requests in a short time. Wait a little and try again.';
  if (status >= 500)
    return `The Luxtempo server could not answer just now (HTTP ${status}). Try again in a moment.`;
  return `The request was refused (HTTP ${status}).`;
}

function unexpectedShape(status: number): ApiRequestError {
  return new ApiRequestError({
    status,
    code: 'unexpected_response',
    message:
      'The server answered in a form this screen does not understand. Reload the page; if it persists, tell your administrator.',
  });
}

/** Retry-After is either whole seconds or an HTTP date. */
export function parseRetryAfter(value: string | null, now: Date = new Date()): number | null {
  if (value === null || value.trim() === '') return null;
  const trimmed = value.trim();
  if (/^\d+$/.test(trimmed)) return Number(trimmed);
  const at = Date.parse(trimmed);
  if (Number.isNaN(at)) return null;
  return Math.max(0, Math.ceil((at - now.getTime()) / 1000));
}

function isRecord(value: unknown): value is Record<string, unknown> {
  return typeof value === 'object' && value !== null && !Array.isArray(value);
}
