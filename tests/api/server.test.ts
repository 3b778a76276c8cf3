import { describe, expect, it } from 'vitest';

// A port of this file's own; the server reads it once, at import.
process.env.PORT = String(39000 + (process.pid % 900));
const { startServer } = await import('../../api/src/server');
const { databaseAnswers } = await import('../../api/src/db/sequelize');

describe('the API server', () => {
  it('when closed, then it finishes the open request, stops accepting and closes the pool', async () => {
    const server = await startServer();
    const base = `http://127.0.0.1:${process.env.PORT}`;
    expect((await fetch(`${base}/api/health`)).status).toBe(200);

    const inFlight = fetch(`${base}/api/health`);
    await new Promise((resolve) => setTimeout(resolve, 5));
    const closed = server.close(2000);
    expect((await inFlight).status).toBe(200);
    await closed;

    await expect(fetch(`${base}/api/health`)).rejects.toThrow();
    expect(await databaseAnswers(500)).toBe(false);
  });
});
