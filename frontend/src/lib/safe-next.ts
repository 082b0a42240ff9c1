/**
 * The page to return to after signing in, taken from `?next=`. Only same-site paths are
 * accepted ("/orgs/1/users"), never "//evil.example" or "https://…", so the sign-in page
 * cannot be used to bounce someone to another site.
 */
export function safeNextPath(next: string | null | undefined, fallback = '/'): string {
  if (!next || !next.startsWith('/') || next.startsWith('//') || next.startsWith('/\\')) return fallback;
  return next;
}

/** "/sign-in?next=%2Forgs%2F1" for the page the visitor was trying to open. */
export function signInPath(next?: string): string {
  return next && next !== '/' ? `/sign-in?next=${encodeURIComponent(next)}` : '/sign-in';
}
