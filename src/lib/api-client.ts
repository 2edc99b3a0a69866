import { apiErrorDto } from '../../shared/schemas/common';
import { takeEarlyResponse } from './early-responses';

/** Every failed API call becomes one of these; `status` 0 means the request never reached the server. */
export class ApiError extends Error {
  readonly status: number;
  readonly code: string;
  readonly fields: Record<string, string> | undefined;
  /** Seconds from a `Retry-After` header (rate limits), when the server sent one. */
  readonly retryAfterSeconds: number | undefined;

  constructor(
    status: number,
    code: string,
    message: string,
    fields?: Record<string, string>,
    retryAfterSeconds?: number,
  ) {
    super(message);
    this.name = 'ApiError';
    this.status = status;
    this.code = code;
    this.fields = fields;
    this.retryAfterSeconds = retryAfterSeconds;
  }
}

export function isApiError(error: unknown): error is ApiError {
  return error instanceof ApiError;
}

/** What a request that never reached the server says. */
export const unreachable = () =>
  new ApiError(0, 'network_error', 'Could not reach Tightloop. Check the connection and try again.');

/** What a 503 from the API means: the server is up but its database is not (the server sends the same words). */
export const DATABASE_UNAVAILABLE_MESSAGE = 'The server cannot reach its database. Try again shortly.';

const FALLBACK_MESSAGES: Record<number, string> = {
  400: 'Some of the values were not accepted.',
  401: 'Please sign in.',
  403: 'You are not allowed to do that.',
  404: 'Not found.',
  409: 'That clashes with something already saved.',
  429: 'Too many attempts. Wait a moment and try again.',
  503: DATABASE_UNAVAILABLE_MESSAGE,
};

function parseRetryAfter(header: string | null): number | undefined {
  if (header == null) return undefined;
  const seconds = Number(header);
  if (Number.isFinite(seconds) && seconds >= 0) return seconds;
  const date = Date.parse(header);
  return Number.isNaN(date) ? undefined : Math.max(0, Math.round((date - Date.now()) / 1000));
}

async function toApiError(response: Response): Promise<ApiError> {
  const retryAfter = parseRetryAfter(response.headers.get('Retry-After'));
  let body: unknown = undefined;
  try {
    body = await response.json();
  } catch {
    // Not JSON (a proxy error page, an empty body): fall back to the status.
  }
  const parsed = apiErrorDto.safeParse(body);
  if (parsed.success) {
    const { code, message, fields } = parsed.data.error;
    return new ApiError(response.status, code, message, fields, retryAfter);
  }
  const message =
    FALLBACK_MESSAGES[response.status] ??
    (response.status >= 500 ? 'The server had a problem. Try again in a moment.' : 'The request failed.');
  return new ApiError(
    response.status,
    response.status >= 500 ? 'server_error' : 'http_error',
    message,
    undefined,
    retryAfter,
  );
}

async function request<T>(method: string, url: string, body?: unknown, signal?: AbortSignal): Promise<T> {
  const headers: Record<string, string> = { Accept: 'application/json' };
  if (body !== undefined) headers['Content-Type'] = 'application/json';
  const send = () =>
    fetch(url, {
      method,
      headers,
      body: body === undefined ? undefined : JSON.stringify(body),
      credentials: 'include',
      signal,
    });
  // A label's address: index.html's boot script may have asked for this already, before the app had started.
  const early = method === 'GET' ? takeEarlyResponse(url) : undefined;
  let response: Response;
  try {
    response = await (early ? early.catch(send) : send());
  } catch (error) {
    if (signal?.aborted) throw error;
    throw unreachable();
  }
  if (!response.ok) throw await toApiError(response);
  if (response.status === 204) return undefined as T;
  return (await response.json()) as T;
}

export const apiClient = {
  get: <T>(url: string, options?: { signal?: AbortSignal }) => request<T>('GET', url, undefined, options?.signal),
  post: <T>(url: string, body?: unknown, options?: { signal?: AbortSignal }) =>
    request<T>('POST', url, body, options?.signal),
  patch: <T>(url: string, body: unknown) => request<T>('PATCH', url, body),
  put: <T>(url: string, body: unknown) => request<T>('PUT', url, body),
  delete: <T>(url: string) => request<T>('DELETE', url),
};
