import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { api, forgetCsrfToken, isApiError, rememberCsrfToken } from '@frontend/lib/api-client';

// The two additions the lab import needs from the fetch wrapper: a multipart upload that still
// carries the CSRF token, and the error's `details` (every problem of a refused file).

let sent: Array<{ url: string; init: RequestInit }> = [];

beforeEach(() => {
  sent = [];
  forgetCsrfToken();
});
afterEach(() => {
  vi.unstubAllGlobals();
});

function answer(status: number, body: unknown) {
  vi.stubGlobal(
    'fetch',
    vi.fn(async (url: string, init: RequestInit = {}) => {
      sent.push({ url, init });
      return new Response(JSON.stringify(body), { status, headers: { 'Content-Type': 'application/json' } });
    }),
  );
}

describe('api.upload', () => {
  it('posts the form as multipart (no JSON content type, so the browser adds the boundary) with the CSRF token', async () => {
    rememberCsrfToken('token-1');
    answer(201, { batch: { id: 4 } });
    const form = new FormData();
    form.append('file', new Blob(['Worker,Date,Result\nRT-011,2025-01-20,0.5\n'], { type: 'text/csv' }), 'lab.csv');
    await expect(api.upload('/api/orgs/1/lab-imports', form)).resolves.toEqual({ batch: { id: 4 } });
    const headers = new Headers(sent[0].init.headers);
    expect(sent[0].init.method).toBe('POST');
    expect(sent[0].init.body).toBe(form);
    expect(headers.get('Content-Type')).toBeNull();
    expect(headers.get('X-CSRF-Token')).toBe('token-1');
  });
});

describe('ApiError details', () => {
  it("keeps the details of a 400, such as a lab file's problems by row and column", async () => {
    rememberCsrfToken('token-1');
    const problems = [{ row: 3, column: 'Worker', message: 'no worker "RT-999" in this organization' }];
    answer(400, { error: { code: 'bad_request', message: 'The lab import was refused (1 problem; nothing was stored)', details: { problems } } });
    const error = await api.post('/api/orgs/1/lab-imports/4/commit', {}).catch((caught: unknown) => caught);
    expect(isApiError(error, 400)).toBe(true);
    expect((error as { details: unknown }).details).toEqual({ problems });
  });
});
