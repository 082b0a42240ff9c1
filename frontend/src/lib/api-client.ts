/**
 * The one way the browser talks to the API (API_CONTRACT.md): JSON in and out, cookies of
 * the same origin, and the synchronizer CSRF token on every state-changing request.
 *
 * CSRF: the token lives in the server session. We fetch it once from GET /api/auth/csrf,
 * keep it in memory (never in storage, so another tab's script cannot read it from there),
 * and send it as `X-CSRF-Token` on POST/PUT/PATCH/DELETE. The server rotates it at sign-in
 * and sign-out: the auth endpoint files call `rememberCsrfToken` / `forgetCsrfToken`. If the
 * server still answers 403 code "csrf" (the session expired, or another tab signed out), we
 * fetch a fresh token and retry the request once.
 */

/** Field path → message, as the server sends it for 400 responses. */
export type FieldErrors = Record<string, string>;

/** A non-2xx answer from the API, or no answer at all (status 0, code "network"). */
export class ApiError extends Error {
  readonly status: number;
  readonly code: string;
  readonly fields: FieldErrors | undefined;
  /** The answer's `error.details` as sent (e.g. a lab import's `{ problems: [...] }`); unchecked. */
  readonly details: unknown;

  constructor(status: number, code: string, message: string, fields?: FieldErrors, details?: unknown) {
    super(message);
    this.name = 'ApiError';
    this.status = status;
    this.code = code;
    this.fields = fields;
    this.details = details;
  }
}

/** Whether an unknown error is an ApiError with the given status. */
export function isApiError(error: unknown, status?: number): error is ApiError {
  return error instanceof ApiError && (status === undefined || error.status === status);
}

type Method = 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';

export interface RequestOptions {
  /** Sent as JSON, or as multipart form data when it is a FormData (file uploads). */
  body?: unknown;
  signal?: AbortSignal;
}

let csrfToken: string | null = null;
let csrfRequest: Promise<string> | null = null;

/** Keep the token the server handed back (sign-in and invitation acceptance include it). */
export function rememberCsrfToken(token: string | null | undefined): void {
  csrfToken = token ?? null;
}

/** Drop the cached token (after sign-out); the next state-changing request fetches a new one. */
export function forgetCsrfToken(): void {
  csrfToken = null;
}

async function currentCsrfToken(): Promise<string> {
  if (csrfToken) return csrfToken;
  // One request even when several mutations start at once.
  csrfRequest ??= send<{ csrfToken: string }>('GET', '/api/auth/csrf', {})
    .then((body) => {
      csrfToken = body.csrfToken;
      return body.csrfToken;
    })
    .finally(() => {
      csrfRequest = null;
    });
  return csrfRequest;
}

async function send<T>(method: Method, path: string, options: RequestOptions, token?: string): Promise<T> {
  const headers: Record<string, string> = { Accept: 'application/json' };
  const isForm = typeof FormData !== 'undefined' && options.body instanceof FormData;
  // A FormData body sets its own multipart Content-Type (with the boundary): leave it to fetch.
  if (options.body !== undefined && !isForm) headers['Content-Type'] = 'application/json';
  if (token) headers['X-CSRF-Token'] = token;

  let response: Response;
  try {
    response = await fetch(path, {
      method,
      headers,
      credentials: 'same-origin',
      body: options.body === undefined ? undefined : isForm ? (options.body as FormData) : JSON.stringify(options.body),
      signal: options.signal,
    });
  } catch (error) {
    if (error instanceof DOMException && error.name === 'AbortError') throw error;
    throw new ApiError(0, 'network', 'Could not reach the Bellwether server. Check your connection and try again.');
  }

  if (response.ok) {
    if (response.status === 204) return undefined as T;
    const text = await response.text();
    return (text ? JSON.parse(text) : undefined) as T;
  }
  throw await toApiError(response);
}

async function toApiError(response: Response): Promise<ApiError> {
  let body: unknown;
  try {
    body = await response.json();
  } catch {
    body = undefined;
  }
  const error = (body as { error?: { code?: unknown; message?: unknown; fields?: unknown; details?: unknown } } | undefined)?.error;
  const code = typeof error?.code === 'string' ? error.code : fallbackCode(response.status);
  const message =
    typeof error?.message === 'string' && error.message
      ? error.message
      : `The server answered ${response.status}${response.statusText ? ` ${response.statusText}` : ''}.`;
  const fields = error?.fields && typeof error.fields === 'object' ? (error.fields as FieldErrors) : undefined;
  return new ApiError(response.status, code, message, fields, error?.details);
}

function fallbackCode(status: number): string {
  if (status === 400) return 'bad_request';
  if (status === 401) return 'unauthorized';
  if (status === 403) return 'forbidden';
  if (status === 404) return 'not_found';
  if (status === 409) return 'conflict';
  if (status === 429) return 'rate_limited';
  return 'internal';
}

async function request<T>(method: Method, path: string, options: RequestOptions = {}): Promise<T> {
  if (method === 'GET') return send<T>(method, path, options);
  try {
    return await send<T>(method, path, options, await currentCsrfToken());
  } catch (error) {
    if (!(isApiError(error, 403) && error.code === 'csrf')) throw error;
    forgetCsrfToken();
    return send<T>(method, path, options, await currentCsrfToken());
  }
}

/** `api.get<Member[]>('/api/orgs/1/members', { signal })` and so on. */
export const api = {
  get: <T>(path: string, options?: Pick<RequestOptions, 'signal'>) => request<T>('GET', path, options),
  post: <T>(path: string, body?: unknown, options?: Pick<RequestOptions, 'signal'>) => request<T>('POST', path, { ...options, body }),
  put: <T>(path: string, body?: unknown, options?: Pick<RequestOptions, 'signal'>) => request<T>('PUT', path, { ...options, body }),
  patch: <T>(path: string, body?: unknown, options?: Pick<RequestOptions, 'signal'>) => request<T>('PATCH', path, { ...options, body }),
  delete: <T = void>(path: string, options?: Pick<RequestOptions, 'signal'>) => request<T>('DELETE', path, options),
  /** POST a multipart form (a file upload), with the CSRF token like every other write. */
  upload: <T>(path: string, form: FormData, options?: Pick<RequestOptions, 'signal'>) => request<T>('POST', path, { ...options, body: form }),
};

/** Builds an API path with each parameter URL-encoded: `apiPath('/api/orgs', orgId, 'members')`. */
export function apiPath(base: string, ...segments: Array<string | number>): string {
  return [base, ...segments.map((segment) => encodeURIComponent(String(segment)))].join('/');
}
