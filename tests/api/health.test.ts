import request from 'supertest';
import { afterAll, describe, expect, it } from 'vitest';
import { createApp } from '../../api/src/app';
import { sequelize } from '../../api/src/db/sequelize';

const app = createApp();

describe('GET /api/health', () => {
  it('when the database answers, then 200 with status ok and the version', async () => {
    const res = await request(app).get('/api/health');
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ status: 'ok', database: 'up' });
    expect(res.body.version).toMatch(/^\d+\.\d+\.\d+/);
  });

  it('when an /api path does not exist, then 404 in the standard error shape', async () => {
    const res = await request(app).get('/api/no-such-thing');
    expect(res.status).toBe(404);
    expect(res.body).toEqual({ error: { code: 'not-found', message: expect.stringContaining('/no-such-thing') } });
  });

  it('when the body is not valid JSON, then 400 in the standard error shape', async () => {
    const res = await request(app).post('/api/health').set('Content-Type', 'application/json').send('{"broken":');
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('bad-request');
  });

  describe('when the database is gone', () => {
    afterAll(async () => undefined);
    it('then 503 with status unavailable', async () => {
      await sequelize.close();
      const res = await request(app).get('/api/health');
      expect(res.status).toBe(503);
      expect(res.body).toMatchObject({ status: 'unavailable', database: 'down' });
    });
  });
});
