/**
 * The one error type the API answers with. Routes and services throw these; the error
 * middleware (middleware/error-handler.ts) turns them into
 * `{ error: { code, message, fields?, details? } }` (API_CONTRACT.md).
 */
export type ErrorCode =
  'bad_request' | 'unauthorized' | 'forbidden' | 'not_found' | 'conflict' | 'unprocessable' | 'rate_limited' | 'csrf' | 'payload_too_large' | 'internal';

/** Field path (`email`, `jobTitles.2`) → what is wrong with it. */
export type FieldErrors = Record<string, string>;

export class HttpError extends Error {
  constructor(
    readonly status: number,
    readonly code: ErrorCode,
    message: string,
    readonly fields?: FieldErrors,
    readonly details?: unknown,
  ) {
    super(message);
    this.name = 'HttpError';
  }
}

/** 400: the input is wrong; `fields` names each bad field. */
export class BadRequest extends HttpError {
  constructor(message: string, fields?: FieldErrors, details?: unknown) {
    super(400, 'bad_request', message, fields, details);
  }
}

/** 401: no session, or a sign-in that failed. */
export class Unauthorized extends HttpError {
  constructor(message = 'Sign in to continue') {
    super(401, 'unauthorized', message);
  }
}

/** 403: signed in, but the role does not allow this. */
export class Forbidden extends HttpError {
  constructor(message = 'Your role does not allow this') {
    super(403, 'forbidden', message);
  }
}

/** 404: unknown id — and also another organization's id, so ids of other organizations are never confirmed. */
export class NotFound extends HttpError {
  constructor(message = 'Not found') {
    super(404, 'not_found', message);
  }
}

/** 409: the request clashes with the current state (a duplicate, the last admin, an accepted invitation). */
export class Conflict extends HttpError {
  constructor(message: string, details?: unknown) {
    super(409, 'conflict', message, undefined, details);
  }
}

/** 422: the request is well formed, but the data cannot be processed by a rule (e.g. too few results to assess). */
export class Unprocessable extends HttpError {
  constructor(message: string, details?: unknown) {
    super(422, 'unprocessable', message, undefined, details);
  }
}
