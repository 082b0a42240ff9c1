/*
 * A signed-in person against a real server process (tests that start backend/src/server.ts):
 * keeps the session cookie and the CSRF token, and sends JSON or multipart with Node's fetch.
 */

export interface HttpSession {
  readonly url: string;
  get(path: string): Promise<Response>;
  /** JSON body; `signal` lets a test abandon the request (the server may be killed under it). */
  post(path: string, body: unknown, signal?: AbortSignal): Promise<Response>;
  /** Multipart form with one file in "file" and text fields. */
  upload(
    path: string,
    file: { name: string; type: string; bytes: Uint8Array },
    fields?: Record<string, string | number>,
    signal?: AbortSignal,
  ): Promise<Response>;
  /** The Cookie and X-CSRF-Token headers, for raw node:http requests. */
  headers(): Record<string, string>;
}

function cookieOf(response: Response, previous: string): string {
  const fresh = response.headers.getSetCookie().map((cookie) => cookie.split(';')[0]);
  return fresh.length > 0 ? fresh.join('; ') : previous;
}

/** Fetches a CSRF token (and so a session cookie); signs in when `email` is given. */
export async function openHttpSession(url: string, email?: string, password?: string): Promise<HttpSession> {
  let cookie = '';
  let token = '';
  const first = await fetch(`${url}/api/auth/csrf`);
  cookie = cookieOf(first, cookie);
  token = ((await first.json()) as { csrfToken: string }).csrfToken;
  const session: HttpSession = {
    url,
    get: (path) => fetch(`${url}${path}`, { headers: { cookie } }),
    post: (path, body, signal) =>
      fetch(`${url}${path}`, {
        method: 'POST',
        headers: { cookie, 'x-csrf-token': token, 'content-type': 'application/json' },
        body: JSON.stringify(body),
        signal,
      }),
    upload: (path, file, fields = {}, signal) => {
      const form = new FormData();
      for (const [key, value] of Object.entries(fields)) form.append(key, String(value));
      form.append('file', new Blob([new Uint8Array(file.bytes)], { type: file.type }), file.name);
      return fetch(`${url}${path}`, { method: 'POST', headers: { cookie, 'x-csrf-token': token }, body: form, signal });
    },
    headers: () => ({ cookie, 'x-csrf-token': token }),
  };
  if (email) {
    const answer = await session.post('/api/auth/sign-in', { email, password });
    if (answer.status !== 200) throw new Error(`Sign-in as ${email} answered ${answer.status}: ${await answer.text()}`);
    cookie = cookieOf(answer, cookie);
    token = ((await answer.json()) as { csrfToken: string }).csrfToken;
  }
  return session;
}
