import { createHash, randomBytes, timingSafeEqual } from 'node:crypto';

/**
 * A random secret for an e-mailed link: 32 bytes from the OS generator, base64url (43 characters).
 * Only `hash` is stored, so a copy of the database cannot be turned into working links.
 */
export function createLinkToken(): { token: string; hash: string } {
  const token = randomBytes(32).toString('base64url');
  return { token, hash: hashToken(token) };
}

/** SHA-256 hex of a link token. A plain fast hash is enough: the token has 256 random bits. */
export function hashToken(token: string): string {
  return createHash('sha256').update(token, 'utf8').digest('hex');
}

/** A CSRF synchronizer token (32 random bytes, base64url). */
export function createCsrfToken(): string {
  return randomBytes(32).toString('base64url');
}

/** Constant-time comparison of two strings (different lengths compare false). */
export function sameSecret(a: string, b: string): boolean {
  const left = Buffer.from(a, 'utf8');
  const right = Buffer.from(b, 'utf8');
  return left.length === right.length && timingSafeEqual(left, right);
}
