import type { ErrorRequestHandler } from 'express';
import { HttpError } from '../errors';
import type { Logger } from '../logger';

interface BodyParserError {
  type: string;
  status?: number;
  limit?: number;
}

function isBodyParserError(error: unknown): error is BodyParserError {
  return typeof error === 'object' && error !== null && 'type' in error && typeof (error as { type: unknown }).type === 'string';
}

function sqliteCode(error: unknown): string | undefined {
  if (typeof error !== 'object' || error === null || !('code' in error)) return undefined;
  const code = (error as { code: unknown }).code;
  return typeof code === 'string' && code.startsWith('SQLITE_') ? code : undefined;
}

/** Turns known failures into HttpErrors; undefined for anything unexpected. */
function asHttpError(error: unknown, jsonLimit: string): HttpError | undefined {
  if (error instanceof HttpError) return error;
  if (isBodyParserError(error)) {
    if (error.type === 'entity.too.large') return new HttpError(413, 'payload_too_large', `The request body is larger than the limit of ${jsonLimit}`);
    if (error.type === 'entity.parse.failed') return new HttpError(400, 'bad_request', 'The request body is not valid JSON');
    if (error.status && error.status >= 400 && error.status < 500)
      return new HttpError(400, 'bad_request', `The request body could not be read (${error.type})`);
  }
  // serve-static's "no such file" under /assets.
  if (typeof error === 'object' && error !== null && (error as { status?: unknown }).status === 404) return new HttpError(404, 'not_found', 'File not found');
  // A safety net: services should check first and say which record clashes.
  const code = sqliteCode(error);
  if (code === 'SQLITE_CONSTRAINT_UNIQUE') return new HttpError(409, 'conflict', 'A record with these values already exists');
  return undefined;
}

/**
 * The one error middleware, registered last. HttpErrors answer with their status and
 * `{ error: { code, message, fields?, details? } }`; anything else is logged with the request id
 * and answered 500 in plain words, without a stack trace. The server keeps running.
 */
export function errorHandler(logger: Logger, jsonLimit: string): ErrorRequestHandler {
  return (error: unknown, req, res, next) => {
    if (res.headersSent) return next(error);
    const known = asHttpError(error, jsonLimit);
    if (known) {
      res.status(known.status).json({
        error: {
          code: known.code,
          message: known.message,
          ...(known.fields ? { fields: known.fields } : {}),
          ...(known.details !== undefined ? { details: known.details } : {}),
        },
      });
      return;
    }
    const requestId = String(req.id ?? '');
    (req.log ?? logger).error({ err: error, requestId }, 'unhandled error');
    res.status(500).json({
      error: {
        code: 'internal',
        message: `Something went wrong on the server. The error was logged${requestId ? ` (request ${requestId})` : ''}.`,
      },
    });
  };
}
