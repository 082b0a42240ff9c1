import { describe, expect, it } from 'vitest';
import { safeNextPath, signInPath } from '@frontend/lib/safe-next';

// The sign-in page returns people to `?next=`; it must never send them to another site
// (an open redirect: OWASP "Unvalidated Redirects and Forwards" cheat sheet).

describe('safeNextPath', () => {
  it('keeps a path on this site, with its query', () => {
    expect(safeNextPath('/orgs/2/users?page=3')).toBe('/orgs/2/users?page=3');
  });

  it.each(['https://evil.example/', '//evil.example/path', '/\\evil.example', 'javascript:alert(1)', 'orgs/2', ''])('falls back to "/" for %j', (next) => {
    expect(safeNextPath(next)).toBe('/');
  });

  it('falls back to the given default when there is no next', () => {
    expect(safeNextPath(null, '/orgs/1')).toBe('/orgs/1');
  });
});

describe('signInPath', () => {
  it('carries the page to return to, encoded', () => {
    expect(signInPath('/orgs/1/users?x=1')).toBe('/sign-in?next=%2Forgs%2F1%2Fusers%3Fx%3D1');
  });

  it('leaves out a return to the start page', () => {
    expect(signInPath('/')).toBe('/sign-in');
    expect(signInPath()).toBe('/sign-in');
  });
});
