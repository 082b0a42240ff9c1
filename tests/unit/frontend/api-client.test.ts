import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { ApiError, api, forgetCsrfToken, rememberCsrfToken } from '@frontend/lib/api-client';

// The browser's fetch wrapper against a scripted fetch: the CSRF handshake of
// API_CONTRACT.md ("CSRF") and the error shape `{ error: { code, message, fields } }`.

interface Call {
  method: string;
  url: string;
  csrf: string | null;
  body: unknown;
}

function json(status: number, body: unknown): Response {
  return new Response(JSON.stringify(body), { status, headers: { 'Content-Type': 'application/json' } });
}

let calls: Call[];
let answers: Array<(call: Call) => Response>;

beforeEach(() => {
  forgetCsrfToken();
  calls = [];
  answers = [];
  vi.stubGlobal(
    'fetch',
    vi.fn(async (url: string, init: RequestInit = {}) => {
      const headers = new Headers(init.headers);
      const call = { method: init.method ?? 'GET', url, csrf: headers.get('X-CSRF-Token'), body: init.body ? JSON.parse(String(init.body)) : undefined };
      calls.push(call);
      const answer = answers.shift();
      if (!answer) throw new Error(`unexpected request ${call.method} ${url}`);
      return answer(call);
    }),
  );
});

afterEach(() => {
  vi.unstubAllGlobals();
});

describe('api client', () => {
  it('a GET sends no CSRF token and returns the parsed body', async () => {
    answers.push(() => json(200, { ok: true }));
    await expect(api.get('/api/health')).resolves.toEqual({ ok: true });
    expect(calls).toEqual([{ method: 'GET', url: '/api/health', csrf: null, body: undefined }]);
  });

  it('the first POST fetches the token from /api/auth/csrf, sends it, and later posts reuse it', async () => {
    answers.push(() => json(200, { csrfToken: 'token-1' }));
    answers.push(() => json(201, { id: 1 }));
    answers.push(() => new Response(null, { status: 204 }));
    await expect(api.post('/api/orgs/1/invitations', { email: 'a@b.example', role: 'analyst' })).resolves.toEqual({ id: 1 });
    await expect(api.delete('/api/orgs/1/invitations/1')).resolves.toBeUndefined();
    expect(calls.map((c) => `${c.method} ${c.url} ${c.csrf}`)).toEqual([
      'GET /api/auth/csrf null',
      'POST /api/orgs/1/invitations token-1',
      'DELETE /api/orgs/1/invitations/1 token-1',
    ]);
    expect(calls[1].body).toEqual({ email: 'a@b.example', role: 'analyst' });
  });

  it('a 403 with code "csrf" fetches a fresh token and retries once', async () => {
    rememberCsrfToken('stale');
    answers.push(() => json(403, { error: { code: 'csrf', message: 'Bad CSRF token' } }));
    answers.push(() => json(200, { csrfToken: 'fresh' }));
    answers.push(() => json(200, { id: 7, role: 'analyst' }));
    await expect(api.patch('/api/orgs/1/members/7', { role: 'analyst' })).resolves.toEqual({ id: 7, role: 'analyst' });
    expect(calls.map((c) => `${c.method} ${c.url} ${c.csrf}`)).toEqual([
      'PATCH /api/orgs/1/members/7 stale',
      'GET /api/auth/csrf null',
      'PATCH /api/orgs/1/members/7 fresh',
    ]);
  });

  it('a second "csrf" refusal is not retried again: it becomes an ApiError', async () => {
    rememberCsrfToken('stale');
    answers.push(() => json(403, { error: { code: 'csrf', message: 'Bad CSRF token' } }));
    answers.push(() => json(200, { csrfToken: 'fresh' }));
    answers.push(() => json(403, { error: { code: 'csrf', message: 'Bad CSRF token' } }));
    const error = await api.post('/api/auth/sign-out').catch((e: unknown) => e);
    expect(error).toBeInstanceOf(ApiError);
    expect((error as ApiError).code).toBe('csrf');
    expect(calls).toHaveLength(3);
  });

  it('a 403 for a missing permission is not retried', async () => {
    rememberCsrfToken('token');
    answers.push(() => json(403, { error: { code: 'forbidden', message: 'Your role cannot do this' } }));
    const error = await api.post('/api/orgs/1/invitations', {}).catch((e: unknown) => e);
    expect(error).toMatchObject({ status: 403, code: 'forbidden', message: 'Your role cannot do this' });
    expect(calls).toHaveLength(1);
  });

  it("a 400 keeps the server's message and each field's message", async () => {
    rememberCsrfToken('token');
    answers.push(() => json(400, { error: { code: 'bad_request', message: 'Check the fields', fields: { email: 'Enter a valid e-mail address' } } }));
    const error = await api.post('/api/auth/sign-in', { email: 'x' }).catch((e: unknown) => e);
    expect(error).toBeInstanceOf(ApiError);
    expect(error).toMatchObject({ status: 400, code: 'bad_request', message: 'Check the fields', fields: { email: 'Enter a valid e-mail address' } });
  });

  it('a non-JSON error answer still becomes an ApiError naming the status', async () => {
    answers.push(() => new Response('<html>Bad gateway</html>', { status: 502, statusText: 'Bad Gateway' }));
    const error = await api.get('/api/me').catch((e: unknown) => e);
    expect(error).toMatchObject({ status: 502, code: 'internal', message: 'The server answered 502 Bad Gateway.' });
  });

  it('no answer at all becomes an ApiError with status 0 and code "network"', async () => {
    answers.push(() => {
      throw new TypeError('fetch failed');
    });
    const error = await api.get('/api/me').catch((e: unknown) => e);
    expect(error).toMatchObject({ status: 0, code: 'network' });
  });

  it('after forgetCsrfToken (sign-out) the next POST asks for a new token', async () => {
    rememberCsrfToken('before-sign-out');
    forgetCsrfToken();
    answers.push(() => json(200, { csrfToken: 'after' }));
    answers.push(() => new Response(null, { status: 202 }));
    await api.post('/api/auth/forgot-password', { email: 'a@b.example' });
    expect(calls.map((c) => c.csrf)).toEqual([null, 'after']);
  });
});
