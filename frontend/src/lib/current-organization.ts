/**
 * The organization a person last worked in, remembered per browser so `/` and `/users`
 * open it again. The URL (`/orgs/:orgId/...`) is what decides the page; this is only the
 * default when the URL names no organization.
 */
const storageKey = 'bellwether.organizationId';

/** The remembered organization id, or null (nothing stored, or storage blocked). */
export function readRememberedOrganization(): string | null {
  try {
    return window.localStorage.getItem(storageKey);
  } catch {
    return null;
  }
}

/** Remember the organization for next time; storage errors (private mode, quota) are ignored. */
export function rememberOrganization(organizationId: string | number): void {
  try {
    window.localStorage.setItem(storageKey, String(organizationId));
  } catch {
    // Storage is a convenience here; the URL still carries the organization.
  }
}
