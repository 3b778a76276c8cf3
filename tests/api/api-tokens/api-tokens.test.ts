import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../api/src/app';
import { ApiToken } from '../../../api/src/models/api-token';
import { User } from '../../../api/src/models/user';
import { hashToken } from '../../../api/src/services/api-tokens';
import { startTestIdentityProvider } from '../../support/identity';
import { signInOverHttp, type SignedInSession } from '../../support/oidc-flow';

const app = createApp();
let tomas: SignedInSession;
let tomasId: string;

beforeAll(async () => {
  await startTestIdentityProvider();
  tomas = await signInOverHttp(app, 'tomas', 'tidewater-plan');
  tomasId = (await request(app).get('/api/me').set('Cookie', tomas.cookie)).body.id;
  await User.update({ roles: ['planner', 'reliability'] }, { where: { id: tomasId } });
});

function create(body: object, session = tomas) {
  return request(app)
    .post('/api/me/tokens')
    .set('Cookie', session.cookie)
    .set('X-CSRF-Token', session.csrfToken)
    .send(body);
}

describe('POST /api/me/tokens', () => {
  it('when a person makes a token, then its secret is shown once, only its hash is stored, and it works as a bearer', async () => {
    const res = await create({ name: 'Logger gateway M2', expiresInDays: 30 });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({
      name: 'Logger gateway M2',
      status: 'active',
      roles: null,
      lastUsedAt: null,
    });
    expect(res.body.secret).toMatch(/^ebl_[\w-]{40,}$/);
    const days = (new Date(res.body.expiresAt).getTime() - Date.now()) / 86_400_000;
    expect(days).toBeGreaterThan(29.9);
    expect(days).toBeLessThanOrEqual(30);

    const stored = await ApiToken.findByPk(res.body.id);
    expect(stored?.tokenHash).toBe(hashToken(res.body.secret));
    expect(JSON.stringify(stored?.toJSON())).not.toContain(res.body.secret);

    const list = await request(app).get('/api/me/tokens').set('Cookie', tomas.cookie);
    expect(JSON.stringify(list.body)).not.toContain(res.body.secret);

    const me = await request(app).get('/api/me').set('Authorization', `Bearer ${res.body.secret}`);
    expect(me.status).toBe(200);
    expect(me.body).toMatchObject({
      id: tomasId,
      roles: ['planner', 'reliability'],
      csrfToken: null,
    });
    expect((await ApiToken.findByPk(res.body.id))?.lastUsedAt).toBeInstanceOf(Date);
  });

  it('when narrowed to some of the owner’s roles, then the token acts with only those', async () => {
    const res = await create({
      name: 'Reliability export',
      expiresInDays: 7,
      roles: ['reliability'],
    });
    expect(res.status).toBe(201);
    expect(res.body.roles).toEqual(['reliability']);
    const me = await request(app).get('/api/me').set('Authorization', `Bearer ${res.body.secret}`);
    expect(me.body.roles).toEqual(['reliability']);
  });

  it('when asking for a role the owner does not hold, then 400 naming roles', async () => {
    const res = await create({ name: 'Sneaky', expiresInDays: 7, roles: ['admin'] });
    expect(res.status).toBe(400);
    expect(res.body.error.issues[0].path).toBe('roles');
    expect(await ApiToken.count({ where: { name: 'Sneaky' } })).toBe(0);
  });

  it('when the owner later loses a role, then the token loses it too: never more than the owner', async () => {
    const res = await create({ name: 'Broad', expiresInDays: 7 });
    await User.update({ roles: ['planner'] }, { where: { id: tomasId } });
    const me = await request(app).get('/api/me').set('Authorization', `Bearer ${res.body.secret}`);
    expect(me.body.roles).toEqual(['planner']);
    const narrowed = await create({
      name: 'Was reliability',
      expiresInDays: 7,
      roles: ['planner'],
    });
    expect(narrowed.status).toBe(201);
    await User.update({ roles: ['planner', 'reliability'] }, { where: { id: tomasId } });
  });

  it.each([
    [{ expiresInDays: 30 }, 'name'],
    [{ name: '  ', expiresInDays: 30 }, 'name'],
    [{ name: 'x' }, 'expiresInDays'],
    [{ name: 'x', expiresInDays: 0 }, 'expiresInDays'],
    [{ name: 'x', expiresInDays: 366 }, 'expiresInDays'],
    [{ name: 'x', expiresInDays: 30, roles: [] }, 'roles'],
  ])('when the body is %j, then 400 naming %s', async (body, field) => {
    const res = await create(body);
    expect(res.status).toBe(400);
    expect(res.body.error.issues[0].path).toBe(field);
  });

  it('when a bearer token tries to make a token, then 403: tokens are made in a signed-in browser', async () => {
    const made = await create({ name: 'Script', expiresInDays: 7 });
    const res = await request(app)
      .post('/api/me/tokens')
      .set('Authorization', `Bearer ${made.body.secret}`)
      .send({ name: 'Child', expiresInDays: 365 });
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('session-required');
  });
});

describe('expired and revoked tokens', () => {
  it('when a token has expired, then it is refused with 401 and listed as expired', async () => {
    const made = await create({ name: 'Short-lived', expiresInDays: 1 });
    await ApiToken.update(
      { expiresAt: new Date(Date.now() - 1000) },
      { where: { id: made.body.id } },
    );
    const res = await request(app)
      .get('/api/me')
      .set('Authorization', `Bearer ${made.body.secret}`);
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe('invalid-token');
    const list = await request(app).get('/api/me/tokens').set('Cookie', tomas.cookie);
    expect(list.body.items.find((t: { id: string }) => t.id === made.body.id).status).toBe(
      'expired',
    );
  });

  it('when the owner revokes a token, then it stops working at once', async () => {
    const made = await create({ name: 'To revoke', expiresInDays: 30 });
    expect(
      (await request(app).get('/api/me').set('Authorization', `Bearer ${made.body.secret}`)).status,
    ).toBe(200);
    const res = await request(app)
      .delete(`/api/me/tokens/${made.body.id}`)
      .set('Cookie', tomas.cookie)
      .set('X-CSRF-Token', tomas.csrfToken);
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ status: 'revoked', revokedAt: expect.any(String) });
    expect(
      (await request(app).get('/api/me').set('Authorization', `Bearer ${made.body.secret}`)).status,
    ).toBe(401);
  });

  it('when someone tries to revoke another person’s token, then 404 and it keeps working', async () => {
    const made = await create({ name: 'Tomas’s own', expiresInDays: 30 });
    const priya = await signInOverHttp(app, 'priya', 'tidewater-plan');
    const res = await request(app)
      .delete(`/api/me/tokens/${made.body.id}`)
      .set('Cookie', priya.cookie)
      .set('X-CSRF-Token', priya.csrfToken);
    expect(res.status).toBe(404);
    expect(
      (await request(app).get('/api/me').set('Authorization', `Bearer ${made.body.secret}`)).status,
    ).toBe(200);
    const theirs = await request(app).get('/api/me/tokens').set('Cookie', priya.cookie);
    expect(theirs.body.items).toEqual([]);
  });
});
