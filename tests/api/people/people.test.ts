import crypto from 'node:crypto';
import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../api/src/app';
import { AccessEvent } from '../../../api/src/models/access-event';
import { User } from '../../../api/src/models/user';
import { issueApiToken } from '../../../api/src/services/api-tokens';
import { createCaller } from '../../support/auth';
import { startTestIdentityProvider } from '../../support/identity';
import { signInOverHttp, TEST_USER_AGENT, type SignedInSession } from '../../support/oidc-flow';

const app = createApp();
let maren: SignedInSession;
let marenId: string;

beforeAll(async () => {
  await startTestIdentityProvider();
  maren = await signInOverHttp(app, 'maren', 'tidewater-admin');
  marenId = (await request(app).get('/api/me').set('Cookie', maren.cookie)).body.id;
});

function asMaren(method: 'get' | 'patch', path: string) {
  const agent = request(app);
  const r = (method === 'get' ? agent.get(path) : agent.patch(path))
    .set('Cookie', maren.cookie)
    .set('User-Agent', TEST_USER_AGENT);
  return method === 'get' ? r : r.set('X-CSRF-Token', maren.csrfToken);
}

describe('GET /api/people', () => {
  it('when an admin lists, then everyone is there by name with roles, state and last sign-in', async () => {
    await User.create({
      email: 'zed@brackenmoor.example',
      name: 'Zed Never',
      subject: null,
      lastSignInAt: null,
      roles: ['planner'],
    });
    const res = await asMaren('get', '/api/people');
    expect(res.status).toBe(200);
    const names = res.body.items.map((p: { name: string }) => p.name);
    expect(names).toEqual([...names].sort());
    expect(res.body.items.find((p: { name: string }) => p.name === 'Maren Oyelaran')).toMatchObject(
      {
        email: 'maren@brackenmoor.example',
        roles: ['admin'],
        active: true,
        lastSignInAt: expect.stringMatching(/^\d{4}-\d\d-\d\dT/),
      },
    );
    expect(
      res.body.items.find((p: { name: string }) => p.name === 'Zed Never').lastSignInAt,
    ).toBeNull();
  });

  it('when searching, then only matches of name or e-mail come back, case-insensitively', async () => {
    const res = await asMaren('get', '/api/people?q=ZED');
    expect(res.body.items.map((p: { name: string }) => p.name)).toEqual(['Zed Never']);
    const byMail = await asMaren('get', '/api/people?q=maren@');
    expect(byMail.body.items).toHaveLength(1);
    const wildcard = await asMaren('get', '/api/people?q=%25');
    expect(wildcard.body.items).toHaveLength(0);
  });
});

describe('PATCH /api/people/:userId', () => {
  it('when an admin takes a role away, then it counts from the person’s next request', async () => {
    const tomas = await signInOverHttp(app, 'tomas', 'tidewater-plan');
    const tomasId = (await request(app).get('/api/me').set('Cookie', tomas.cookie)).body.id;
    await asMaren('patch', `/api/people/${tomasId}`)
      .send({ roles: ['planner', 'admin'] })
      .expect(200);
    expect((await request(app).get('/api/people').set('Cookie', tomas.cookie)).status).toBe(200);

    const res = await asMaren('patch', `/api/people/${tomasId}`).send({ roles: ['planner'] });
    expect(res.status).toBe(200);
    expect(res.body.roles).toEqual(['planner']);
    expect((await request(app).get('/api/people').set('Cookie', tomas.cookie)).status).toBe(403);
    expect((await request(app).get('/api/me').set('Cookie', tomas.cookie)).body.roles).toEqual([
      'planner',
    ]);
  });

  it('when roles change, then the sign-in log says who changed what, when, from which address and browser', async () => {
    const person = await User.create({
      email: 'log@brackenmoor.example',
      name: 'Log Person',
      subject: 'log',
      lastSignInAt: null,
    });
    await asMaren('patch', `/api/people/${person.id}`)
      .send({ roles: ['technician'] })
      .expect(200);
    const event = await AccessEvent.findOne({
      where: { kind: 'roles-changed', userId: person.id },
    });
    expect(event).toMatchObject({
      actorId: marenId,
      userAgent: TEST_USER_AGENT,
      detail: { from: [], to: ['technician'] },
    });
    expect(event?.ip).toMatch(/127\.0\.0\.1|::1/);
    expect(event?.createdAt).toBeInstanceOf(Date);
  });

  it('when a person is deactivated, then their session and their API tokens stop working at once', async () => {
    const ines = await signInOverHttp(app, 'ines', 'tidewater-rel');
    const inesId = (await request(app).get('/api/me').set('Cookie', ines.cookie)).body.id;
    const { secret } = await issueApiToken(inesId, 'gateway', new Date(Date.now() + 86_400_000));
    expect(
      (await request(app).get('/api/me').set('Authorization', `Bearer ${secret}`)).status,
    ).toBe(200);

    const res = await asMaren('patch', `/api/people/${inesId}`).send({ active: false });
    expect(res.body.active).toBe(false);
    expect((await request(app).get('/api/me').set('Cookie', ines.cookie)).status).toBe(401);
    expect(
      (await request(app).get('/api/me').set('Authorization', `Bearer ${secret}`)).status,
    ).toBe(401);
    expect(await AccessEvent.count({ where: { kind: 'deactivated', userId: inesId } })).toBe(1);

    await asMaren('patch', `/api/people/${inesId}`).send({ active: true }).expect(200);
    expect(
      (await request(app).get('/api/me').set('Authorization', `Bearer ${secret}`)).status,
    ).toBe(200);
    expect(await AccessEvent.count({ where: { kind: 'reactivated', userId: inesId } })).toBe(1);
  });

  it('when the last active admin would lose the role, then 409 and nothing changes', async () => {
    await User.update({ roles: ['planner'] }, { where: { subject: 'tomas' } });
    const res = await asMaren('patch', `/api/people/${marenId}`).send({ roles: ['planner'] });
    expect(res.status).toBe(409);
    expect(res.body.error.message).toMatch(/at least one active admin/);
    expect((await User.findByPk(marenId))?.roles).toEqual(['admin']);
  });

  it('when an admin would deactivate themselves, then 409', async () => {
    const res = await asMaren('patch', `/api/people/${marenId}`).send({ active: false });
    expect(res.status).toBe(409);
  });

  it('when a role is not one of Ebbline’s, then 400 naming the field', async () => {
    const person = await User.create({
      email: 'bad@brackenmoor.example',
      name: 'Bad Input',
      subject: 'bad',
      lastSignInAt: null,
    });
    const res = await asMaren('patch', `/api/people/${person.id}`).send({ roles: ['boss'] });
    expect(res.status).toBe(400);
    expect(res.body.error.issues[0].path).toBe('roles.0');
    const empty = await asMaren('patch', `/api/people/${person.id}`).send({});
    expect(empty.status).toBe(400);
    const extra = await asMaren('patch', `/api/people/${person.id}`).send({
      roles: [],
      email: 'x@y.z',
    });
    expect(extra.status).toBe(400);
  });

  it('when the id is not a person id, then 400 naming userId; when nobody has it, 404', async () => {
    const bad = await asMaren('patch', '/api/people/not-an-id').send({ roles: [] });
    expect(bad.status).toBe(400);
    expect(bad.body.error.issues[0].path).toBe('userId');
    const missing = await asMaren('patch', `/api/people/${crypto.randomUUID()}`).send({
      roles: [],
    });
    expect(missing.status).toBe(404);
  });

  it('when a planner tries, then 403', async () => {
    const planner = await createCaller(['planner']);
    const res = await request(app)
      .patch(`/api/people/${marenId}`)
      .set('Authorization', planner.auth)
      .send({ roles: [] });
    expect(res.status).toBe(403);
  });
});

describe('GET /api/people/admins', () => {
  it('when someone without a role asks, then they learn the active admins to ask for access', async () => {
    const noor = await signInOverHttp(app, 'noor', 'tidewater-new');
    const res = await request(app).get('/api/people/admins').set('Cookie', noor.cookie);
    expect(res.status).toBe(200);
    expect(res.body.items).toContainEqual({
      name: 'Maren Oyelaran',
      email: 'maren@brackenmoor.example',
    });
    expect(res.body.items.every((a: object) => Object.keys(a).sort().join() === 'email,name')).toBe(
      true,
    );
  });
});
