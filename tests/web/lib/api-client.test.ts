import { afterEach, describe, expect, it, vi } from 'vitest';
import { DATABASE_UNAVAILABLE_MESSAGE } from '../../../shared/constants/availability';
import { ApiError, apiFetch, retryDelayWhileUnavailable } from '../../../web/src/lib/api-client';

function answer(status: number, body: unknown, headers: Record<string, string> = {}): void {
  vi.stubGlobal(
    'fetch',
    async () =>
      new Response(JSON.stringify(body), {
        status,
        headers: { 'content-type': 'application/json', ...headers },
      }),
  );
}

async function failureOf(path: string): Promise<ApiError> {
  const error = await apiFetch(path).catch((err: unknown) => err);
  expect(error).toBeInstanceOf(ApiError);
  return error as ApiError;
}

describe('apiFetch', () => {
  afterEach(() => vi.unstubAllGlobals());

  it("when the API cannot reach its database, then the error says so in Ebbline's words and carries Retry-After", async () => {
    answer(
      503,
      { error: { code: 'database-unavailable', message: 'whatever the server said' } },
      { 'retry-after': '5' },
    );
    const error = await failureOf('/api/sites');
    expect(error).toMatchObject({
      status: 503,
      code: 'database-unavailable',
      retryAfterSeconds: 5,
    });
    expect(error.message).toBe(DATABASE_UNAVAILABLE_MESSAGE);
    expect(error.message).toContain(
      "Ebbline can't reach its database; your work is kept, try again in a moment",
    );
  });

  it('when another error comes back, then its own message is kept and no retry time is invented', async () => {
    answer(409, { error: { code: 'stale-version', message: 'Someone else saved this site.' } });
    const error = await failureOf('/api/sites/1');
    expect(error).toMatchObject({
      status: 409,
      code: 'stale-version',
      message: 'Someone else saved this site.',
    });
    expect(error.retryAfterSeconds).toBeUndefined();
  });
});

describe('retryDelayWhileUnavailable', () => {
  it('when a query failed with a 503, then it asks again after the Retry-After time', () => {
    expect(retryDelayWhileUnavailable(new ApiError(503, 'database-unavailable', 'x', [], 3))).toBe(
      3000,
    );
    expect(retryDelayWhileUnavailable(new ApiError(503, 'stopping', 'x'))).toBe(5000);
  });

  it('when a query failed otherwise or did not fail, then nothing is asked again on a timer', () => {
    expect(retryDelayWhileUnavailable(new ApiError(500, 'internal', 'x'))).toBe(false);
    expect(retryDelayWhileUnavailable(new ApiError(401, 'unauthenticated', 'x'))).toBe(false);
    expect(retryDelayWhileUnavailable(null)).toBe(false);
  });
});

describe('apiFetch: a refusal with more than its message', () => {
  afterEach(() => vi.unstubAllGlobals());

  it('when the error carries other fields (a column question’s candidates), then they are kept as details', async () => {
    answer(422, { error: { code: 'columns-ambiguous', message: 'Choose the voltage column.', issues: [], candidates: { columns: ['t', 'a', 'b'] } } });
    const error = await failureOf('/api/logger-files/preview');
    expect(error.details).toEqual({ candidates: { columns: ['t', 'a', 'b'] } });
    answer(404, { error: { code: 'not-found', message: 'Bank was not found.' } });
    expect((await failureOf('/api/banks/x')).details).toEqual({});
  });
});
