import { errorBodySchema } from '@shared/schemas/error';
import { readToken } from './session-token';

/** A failed API call, carrying the server's `{ error: { code, message, details } }`. */
export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly details: unknown[] = [],
  ) {
    super(message);
    this.name = 'ApiError';
  }

  /**
   * Field messages keyed by dotted path (`'email'`, `'lines.0.qty'`), from zod issues in
   * `details`; the first message per field wins so a form shows one line per input.
   */
  fieldErrors(): Record<string, string> {
    const byField: Record<string, string> = {};
    for (const issue of this.details) {
      if (!isFieldIssue(issue) || issue.path.length === 0) continue;
      const field = issue.path.join('.');
      // Said under its field, so it starts a sentence.
      byField[field] ??= issue.message.charAt(0).toUpperCase() + issue.message.slice(1);
    }
    return byField;
  }

  /**
   * Puts the messages for `fields` beside those fields in `target` (a form's server errors); false
   * when none of them was named, so the caller shows the message above the form instead.
   */
  placeFieldErrors(fields: readonly string[], target: Record<string, string | undefined>): boolean {
    const byField = this.fieldErrors();
    const placed = fields.filter((field) => byField[field]);
    for (const field of placed) target[field] = byField[field];
    return placed.length > 0;
  }

  /** True when the change was made on a copy someone else changed first (409 `stale`). */
  get isStale(): boolean {
    return this.status === 409 && this.code === 'stale';
  }

  /** The state as it is now that a 409 `stale` carries in `details[0].current`, if any. */
  staleCurrent<T>(): T | undefined {
    if (!this.isStale) return undefined;
    const first = this.details[0];
    if (typeof first !== 'object' || first === null || !('current' in first)) return undefined;
    return (first as { current: T }).current;
  }
}

interface FieldIssue {
  path: (string | number)[];
  message: string;
}

function isFieldIssue(issue: unknown): issue is FieldIssue {
  if (typeof issue !== 'object' || issue === null) return false;
  const candidate = issue as Partial<FieldIssue>;
  return Array.isArray(candidate.path) && typeof candidate.message === 'string';
}

export type HttpMethod = 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';

export interface RequestOptions {
  method?: HttpMethod;
  body?: unknown;
  query?: Record<string, string | number | boolean | undefined>;
  signal?: AbortSignal;
  /** Extra request headers, e.g. an `Idempotency-Key` that makes a POST safe to retry. */
  headers?: Record<string, string>;
  /**
   * The `version` of the representation this change was made on, sent as `If-Match`: the server
   * refuses the change with 409 `stale` when someone else changed it first.
   */
  ifMatch?: string;
  /**
   * For calls made without a session (sign-in): no token is sent and a 401 means
   * "wrong credentials", not "session over".
   */
  anonymous?: boolean;
}

type UnauthorizedHandler = () => void;
let unauthorizedHandler: UnauthorizedHandler | null = null;

/**
 * Registers what happens when the server rejects the session (401). The auth store registers
 * it, so this module never imports the store or the router.
 */
export function onUnauthorized(handler: UnauthorizedHandler | null): void {
  unauthorizedHandler = handler;
}

/** Calls `/api<path>` with the session token and JSON; resolves the parsed body or throws ApiError. */
export async function request<T>(path: string, options: RequestOptions = {}): Promise<T> {
  const { method = 'GET', body } = options;
  const response = await send(path, options, {
    method,
    accept: 'application/json',
    body: body === undefined ? undefined : JSON.stringify(body),
  });
  if (response.status === 204) return undefined as T;
  const text = await response.text();
  return (text ? JSON.parse(text) : undefined) as T;
}

function buildUrl(path: string, query: RequestOptions['query']): string {
  const url = `/api${path.startsWith('/') ? path : `/${path}`}`;
  if (!query) return url;
  const params = new URLSearchParams();
  for (const [key, value] of Object.entries(query)) {
    if (value !== undefined) params.set(key, String(value));
  }
  const search = params.toString();
  return search ? `${url}?${search}` : url;
}

// Proxies and crashed servers answer with HTML or nothing; the user still needs a sentence.
async function errorFromResponse(response: Response): Promise<ApiError> {
  let payload: unknown;
  try {
    payload = await response.json();
  } catch {
    payload = undefined;
  }
  const parsed = errorBodySchema.safeParse(payload);
  if (parsed.success) {
    const { code, message, details } = parsed.data.error;
    return new ApiError(response.status, code, message, details ?? []);
  }
  return new ApiError(response.status, `http_${response.status}`, fallbackMessage(response.status));
}

/**
 * The ApiError of a failed call made outside fetch (an XMLHttpRequest upload), built from its
 * status and parsed body like `request` builds one, with the same signed-out handling of a 401.
 */
export function apiErrorFromBody(status: number, payload: unknown): ApiError {
  const parsed = errorBodySchema.safeParse(payload);
  const error = parsed.success
    ? new ApiError(status, parsed.data.error.code, parsed.data.error.message, parsed.data.error.details ?? [])
    : new ApiError(status, `http_${status}`, fallbackMessage(status));
  if (status === 401) unauthorizedHandler?.();
  return error;
}

function fallbackMessage(status: number): string {
  if (status === 401) return 'Please sign in.';
  if (status === 403) return 'Your role may not do this.';
  if (status === 404) return 'Not found.';
  if (status === 429) return 'Too many attempts. Wait a moment and try again.';
  if (status >= 500) return 'The server ran into a problem. Try again shortly.';
  return `The request failed (HTTP ${status}).`;
}

/** Shorthands for the verbs, so API modules read like the routes they call. */
export const http = {
  get: <T>(path: string, options?: Omit<RequestOptions, 'method' | 'body'>) =>
    request<T>(path, { ...options, method: 'GET' }),
  post: <T>(path: string, body?: unknown, options?: Omit<RequestOptions, 'method' | 'body'>) =>
    request<T>(path, { ...options, method: 'POST', body }),
  put: <T>(path: string, body?: unknown, options?: Omit<RequestOptions, 'method' | 'body'>) =>
    request<T>(path, { ...options, method: 'PUT', body }),
  patch: <T>(path: string, body?: unknown, options?: Omit<RequestOptions, 'method' | 'body'>) =>
    request<T>(path, { ...options, method: 'PATCH', body }),
  delete: <T>(path: string, options?: Omit<RequestOptions, 'method' | 'body'>) =>
    request<T>(path, { ...options, method: 'DELETE' }),
};

/**
 * A GET with the session token that resolves the raw Response of a successful call, for bodies
 * that are not JSON: files (`blob()`) and server-sent event streams (`body`). Failures throw
 * ApiError exactly as `request` does.
 */
export async function requestRaw(
  path: string,
  options: Omit<RequestOptions, 'method' | 'body'> & { accept?: string } = {},
): Promise<Response> {
  return send(path, options, { method: 'GET', accept: options.accept ?? '*/*' });
}

/** The one fetch call: token, network failure and error body handling shared by every request. */
async function send(
  path: string,
  options: Omit<RequestOptions, 'method' | 'body'>,
  init: { method: HttpMethod; accept: string; body?: string },
): Promise<Response> {
  const { query, signal, anonymous = false } = options;
  const headers: Record<string, string> = { ...options.headers, Accept: init.accept };
  if (options.ifMatch !== undefined) headers['If-Match'] = `"${options.ifMatch}"`;
  if (init.body !== undefined) headers['Content-Type'] = 'application/json';
  const token = anonymous ? null : readToken();
  if (token) headers.Authorization = `Bearer ${token}`;

  let response: Response;
  try {
    response = await fetch(buildUrl(path, query), { method: init.method, headers, body: init.body, signal });
  } catch (cause) {
    if (cause instanceof DOMException && cause.name === 'AbortError') throw cause;
    throw new ApiError(0, 'network_error', 'The server cannot be reached. Check the connection and try again.');
  }
  if (!response.ok) {
    const error = await errorFromResponse(response);
    if (response.status === 401 && !anonymous) unauthorizedHandler?.();
    throw error;
  }
  return response;
}
