import type { Request, RequestHandler } from 'express';
import { HttpError } from '../errors';
import { createCsrfToken, sameSecret } from '../services/tokens';

const safeMethods = new Set(['GET', 'HEAD', 'OPTIONS']);

/** The session's CSRF token, made on first use. */
export function csrfTokenOf(req: Request): string {
  req.session.csrfToken ??= createCsrfToken();
  return req.session.csrfToken;
}

/** A fresh token (sign-in replaces the session, and with it the token). */
export function renewCsrfToken(req: Request): string {
  req.session.csrfToken = createCsrfToken();
  return req.session.csrfToken;
}

/**
 * Synchronizer-token CSRF protection (OWASP CSRF Prevention Cheat Sheet, "Synchronizer Token
 * Pattern"): every POST/PUT/PATCH/DELETE must carry the session's token in `X-CSRF-Token`.
 * A cross-site form cannot read the token nor set the header, so a forged request is refused.
 */
export const csrfProtection: RequestHandler = (req, _res, next) => {
  if (safeMethods.has(req.method)) return next();
  const sent = req.get('x-csrf-token');
  const expected = req.session?.csrfToken;
  if (!sent || !expected || !sameSecret(sent, expected)) {
    return next(
      new HttpError(
        403,
        'csrf',
        sent
          ? 'The CSRF token is wrong or expired: fetch a new one from GET /api/auth/csrf'
          : 'The X-CSRF-Token header is missing: fetch the token from GET /api/auth/csrf and send it with every change',
      ),
    );
  }
  next();
};
