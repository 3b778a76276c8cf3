import { DATABASE_UNAVAILABLE_MESSAGE } from '../../../shared/constants/availability';

/** One field's problem as the API reports it. */
export interface ApiFieldIssue {
  path: string;
  message: string;
}

/** A non-2xx answer of the API, in its standard error shape. */
export class ApiError extends Error {
  override name = 'ApiError';
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly issues: ApiFieldIssue[] = [],
    /** From a 503's Retry-After: when asking again may succeed. */
    readonly retryAfterSeconds?: number,
    /** The error's other fields, when a refusal carries more than its message (e.g. `candidates`). */
    readonly details: Record<string, unknown> = {},
  ) {
    super(message);
  }
}

/**
 * While the API says it cannot serve for a moment (503: its database away, or a restart), how
 * long to wait before asking again; false for every other outcome. Queries use it to refetch
 * by themselves, so a page recovers once the database is back, in the same session.
 */
export function retryDelayWhileUnavailable(error: unknown): number | false {
  if (!(error instanceof ApiError) || error.status !== 503) return false;
  return (error.retryAfterSeconds ?? 5) * 1000;
}

let csrfToken: string | undefined;

/** The session's CSRF token, sent back on every state-changing request. */
export function setCsrfToken(token: string | undefined): void {
  csrfToken = token;
}

/** The session's CSRF token as last set, for requests sent without apiFetch (uploads with progress). */
export function currentCsrfToken(): string | null {
  return csrfToken ?? null;
}

/**
 * Fetches JSON from the API; throws ApiError on any non-2xx answer (and on a network
 * failure, as status 0) so TanStack Query sees failures as errors.
 */
export async function apiFetch<T>(path: string, init: RequestInit = {}): Promise<T> {
  const method = (init.method ?? 'GET').toUpperCase();
  const headers = new Headers(init.headers);
  headers.set('Accept', 'application/json');
  if (init.body !== undefined && !(init.body instanceof FormData)) {
    headers.set('Content-Type', 'application/json');
  }
  if (method !== 'GET' && method !== 'HEAD' && csrfToken) headers.set('X-CSRF-Token', csrfToken);

  let response: Response;
  try {
    response = await fetch(path, { ...init, headers, credentials: 'same-origin' });
  } catch {
    throw new ApiError(0, 'network', 'Ebbline cannot reach its server. Check the connection and try again.');
  }
  const text = await response.text();
  const body: unknown = text ? safeJson(text) : undefined;
  if (!response.ok) {
    const error = (body as { error?: { code?: string; message?: string; issues?: ApiFieldIssue[] } })?.error;
    const retryAfter = Number(response.headers.get('Retry-After'));
    throw new ApiError(
      response.status,
      error?.code ?? 'http-' + response.status,
      error?.code === 'database-unavailable'
        ? DATABASE_UNAVAILABLE_MESSAGE
        : (error?.message ?? `The server answered ${response.status}.`),
      error?.issues,
      Number.isFinite(retryAfter) && retryAfter > 0 ? retryAfter : undefined,
      errorDetails(error),
    );
  }
  return body as T;
}

/** The fields of an API error other than its code, message and issues (e.g. `candidates`). */
export function errorDetails(error: object | undefined): Record<string, unknown> {
  if (!error) return {};
  const { code: _code, message: _message, issues: _issues, ...rest } = error as Record<string, unknown>;
  return rest;
}

function safeJson(text: string): unknown {
  try {
    return JSON.parse(text);
  } catch {
    return undefined;
  }
}
