import type { z } from 'zod';
import { BadRequest, type FieldErrors } from './errors';

type Part = 'body' | 'query' | 'parameters';

/**
 * Parses one part of a request with a zod schema. On failure throws `BadRequest` whose `fields`
 * maps each field path to its message and whose message names every field, e.g.
 * `Check the request body: email: Enter a valid e-mail address; password: Use at least 10 characters`.
 */
function parsePart<Schema extends z.ZodType>(schema: Schema, value: unknown, part: Part): z.infer<Schema> {
  const result = schema.safeParse(value ?? {});
  if (result.success) return result.data;
  const fields: FieldErrors = {};
  const general: string[] = [];
  for (const issue of result.error.issues) {
    const path = issue.path.map(String).join('.');
    if (path === '') general.push(issue.message);
    else fields[path] ??= issue.message;
  }
  const named = Object.entries(fields).map(([path, message]) => `${path}: ${message}`);
  const message = `Check the request ${part}: ${[...general, ...named].join('; ')}`;
  throw new BadRequest(message, Object.keys(fields).length > 0 ? fields : undefined);
}

/** Parses `req.body`. */
export const parseBody = <Schema extends z.ZodType>(schema: Schema, body: unknown) => parsePart(schema, body, 'body');
/** Parses `req.query` (Express 5: read-only, so keep the result in a variable). */
export const parseQuery = <Schema extends z.ZodType>(schema: Schema, query: unknown) => parsePart(schema, query, 'query');
/** Parses `req.params`. */
export const parseParams = <Schema extends z.ZodType>(schema: Schema, params: unknown) => parsePart(schema, params, 'parameters');
