import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../api/src/app';
import { User } from '../../../api/src/models/user';
import { createCaller } from '../../support/auth';
import { startTestIdentityProvider } from '../../support/identity';
import { signInOverHttp, type SignedInSession } from '../../support/oidc-flow';

const app = createApp();
let maren: SignedInSession;
let target: User;

beforeAll(async () => {
  await startTestIdentityProvider();
  maren = await signInOverHttp(app, 'maren', 'tidewater-admin');
  target = await User.create({
    email: 'new@brackenmoor.example',
    name: 'New Starter',
    subject: 'new',
    lastSignInAt: null,
  });
});

describe('CSRF protection of session requests', () => {
  it('when a session PATCH has no X-CSRF-Token, then 403 csrf-failed and nothing changes', async () => {
    const res = await request(app)
      .patch(`/api/people/${target.id}`)
      .set('Cookie', maren.cookie)
      .send({ roles: ['planner'] });
    expect(res.status).toBe(403);
    expect(res.body).toEqual({
      error: { code: 'csrf-failed', message: expect.stringContaining('X-CSRF-Token') },
    });
    await target.reload();
    expect(target.roles).toEqual([]);
  });

  it('when the token is another session’s, then 403', async () => {
    const other = await signInOverHttp(app, 'maren', 'tidewater-admin');
    const res = await request(app)
      .patch(`/api/people/${target.id}`)
      .set('Cookie', maren.cookie)
      .set('X-CSRF-Token', other.csrfToken)
      .send({ roles: ['planner'] });
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('csrf-failed');
  });

  it('when the token is almost right, then 403', async () => {
    // change the last character to one it is not, so the token is never the real one by chance
    const last = maren.csrfToken.slice(-1);
    const almost = `${maren.csrfToken.slice(0, -1)}${last === 'A' ? 'B' : 'A'}`;
    const res = await request(app)
      .post('/api/me/tokens')
      .set('Cookie', maren.cookie)
      .set('X-CSRF-Token', almost)
      .send({ name: 'x', expiresInDays: 7 });
    expect(res.status).toBe(403);
  });

  it('when the session’s own token is sent, then the change goes through', async () => {
    const res = await request(app)
      .patch(`/api/people/${target.id}`)
      .set('Cookie', maren.cookie)
      .set('X-CSRF-Token', maren.csrfToken)
      .send({ roles: ['planner'] });
    expect(res.status).toBe(200);
    expect(res.body.roles).toEqual(['planner']);
  });

  it('when a GET is made without the token, then it is not needed', async () => {
    expect((await request(app).get('/api/people').set('Cookie', maren.cookie)).status).toBe(200);
  });

  it('when the caller uses an API token, then no CSRF token is needed', async () => {
    const admin = await createCaller(['admin']);
    const res = await request(app)
      .patch(`/api/people/${target.id}`)
      .set('Authorization', admin.auth)
      .send({ roles: ['technician'] });
    expect(res.status).toBe(200);
  });

  it('when nobody is signed in, then a POST is 401, not a CSRF failure', async () => {
    const res = await request(app).patch(`/api/people/${target.id}`).send({ roles: [] });
    expect(res.status).toBe(401);
  });
});
