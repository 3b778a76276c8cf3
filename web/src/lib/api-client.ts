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
  ) {
    super(message);
  }
}

let csrfToken: string | undefined;

/** The session's CSRF token, sent back on every state-changing request. */
export function setCsrfToken(token: string | undefined): void {
  csrfToken = token;
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
    throw new ApiError(
      response.status,
      error?.code ?? 'http-' + response.status,
      error?.message ?? `The server answered ${response.status}.`,
      error?.issues,
    );
  }
  return body as T;
}

function safeJson(text: string): unknown {
  try {
    return JSON.parse(text);
  } catch {
    return undefined;
  }
}
