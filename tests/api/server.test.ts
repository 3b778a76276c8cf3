import { describe, expect, it } from 'vitest';
import { holdRequest } from '../support/held-request';

// A port of this file's own; the server reads it once, at import.
process.env.PORT = String(39000 + (process.pid % 900));
const { startServer } = await import('../../api/src/server');
const { databaseAnswers } = await import('../../api/src/db/sequelize');

describe('the API server', () => {
  it('when closed, then readiness turns 503 and new requests are turned away, the open request finishes, then it stops accepting and closes the pool', async () => {
    const server = await startServer();
    const base = `http://127.0.0.1:${process.env.PORT}`;
    expect((await fetch(`${base}/api/health`)).status).toBe(200);

    // taken in before the stop; unauthenticated, it still needs its body to be answered
    const inFlight = await holdRequest(`${base}/api/sites`, { name: 'x' }, { authorization: 'Bearer not-a-token' });
    const closed = server.close(10_000);

    const health = await fetch(`${base}/api/health`);
    expect(health.status).toBe(503);
    expect(health.headers.get('retry-after')).toMatch(/^\d+$/);
    expect(await health.json()).toMatchObject({ status: 'stopping' });
    const late = await fetch(`${base}/api/me`);
    expect(late.status).toBe(503);
    expect(await late.json()).toMatchObject({ error: { code: 'stopping' } });

    // the open request is answered with the database still there (an unknown token is a 401)
    expect(await inFlight.finish()).toEqual({ status: 401, code: 'invalid-token' });
    await closed;

    await expect(fetch(`${base}/api/health`)).rejects.toThrow();
    expect(await databaseAnswers(500)).toBe(false);
  });
});
