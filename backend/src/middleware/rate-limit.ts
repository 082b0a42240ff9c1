import type { Request, RequestHandler } from 'express';
import { ipKeyGenerator, rateLimit } from 'express-rate-limit';
import type { RateLimit, RateLimits } from '../config';
import { HttpError } from '../errors';

export type LimiterName = keyof RateLimits;

function emailOf(req: Request): string {
  const body: unknown = req.body;
  const email = body && typeof body === 'object' && 'email' in body ? (body as { email: unknown }).email : '';
  return typeof email === 'string' ? email.trim().toLowerCase() : '';
}

// IPv6 clients are grouped by /56 (ipKeyGenerator), so one host cannot dodge a limit by cycling addresses.
const byAddress = (req: Request) => ipKeyGenerator(req.ip ?? '');
const byAddressAndEmail = (req: Request) => `${ipKeyGenerator(req.ip ?? '')}|${emailOf(req)}`;

function limiter(settings: RateLimit, keyGenerator: (req: Request) => string, failuresOnly: boolean): RequestHandler {
  const minutes = Math.max(1, Math.ceil(settings.windowMs / 60_000));
  return rateLimit({
    windowMs: settings.windowMs,
    limit: settings.limit,
    keyGenerator,
    skipSuccessfulRequests: failuresOnly,
    standardHeaders: 'draft-7',
    legacyHeaders: false,
    handler: (_req, _res, next) => next(new HttpError(429, 'rate_limited', `Too many attempts. Wait ${minutes} minutes and try again.`)),
  });
}

/**
 * One set of limiters per app (memory store; a restart forgets them, which is acceptable for a
 * single-process server). Routes name the limiters they use (routes/define-route.ts `rateLimits`).
 */
export function createLimiters(limits: RateLimits): Record<LimiterName, RequestHandler> {
  return {
    signIn: limiter(limits.signIn, byAddressAndEmail, true),
    signInPerAddress: limiter(limits.signInPerAddress, byAddress, true),
    forgotPassword: limiter(limits.forgotPassword, byAddressAndEmail, false),
    resetPassword: limiter(limits.resetPassword, byAddress, true),
  };
}
