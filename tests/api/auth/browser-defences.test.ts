/**
 * Defences for what a browser does on its own: anonymous visits to /auth/login store nothing,
 * answers of the API are never cached, and a change sent from another origin's page is refused
 * (beside the CSRF token).
 */
import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../api/src/app';
import { getConfig } from '../../../api/src/config/env';
import { sequelize } from '../../../api/src/db/sequelize';
import { ApiToken } from '../../../api/src/models/api-token';
import { User } from '../../../api/src/models/user';
import { createCaller } from '../../support/auth';
import { startTestIdentityProvider } from '../../support/identity';
import { signInOverHttp, type SignedInSession } from '../../support/oidc-flow';

const app = createApp();
let maren: SignedInSession;

async function sessionRows(): Promise<number> {
  const [rows] = (await sequelize.query('SELECT count(*)::int AS n FROM sessions')) as [
    Array<{ n: number }>,
    unknown,
  ];
  return rows[0]!.n;
}

beforeAll(async () => {
  await startTestIdentityProvider();
  maren = await signInOverHttp(app, 'maren', 'tidewater-admin');
});

describe('anonymous visits to /auth/login', () => {
  it('when 300 anonymous visits come in a burst, then each starts a sign-in and the sessions table does not grow', async () => {
    const before = await sessionRows();
    const answers = [];
    for (let batch = 0; batch < 10; batch++) {
      answers.push(
        ...(await Promise.all(Array.from({ length: 30 }, () => request(app).get('/auth/login')))),
      );
    }
    expect(answers.every((a) => a.status === 303)).toBe(true);
    expect(answers.every((a) => String(a.headers.location).startsWith(getConfig().OIDC_ISSUER))).toBe(true);
    expect(await sessionRows()).toBe(before);
  });

  it('when a sign-in completes, then exactly one session row is written', async () => {
    const before = await sessionRows();
    await signInOverHttp(app, 'tomas', 'tidewater-plan');
    expect(await sessionRows()).toBe(before + 1);
  });

  it('when the pre-sign-in cookie is set, then it is HttpOnly, SameSite=Lax, for /auth only and short-lived', async () => {
    const res = await request(app).get('/auth/login');
    const line = (res.headers['set-cookie'] as unknown as string[]).find((l) =>
      l.startsWith(`${getConfig().SESSION_COOKIE_NAME}.sign-in=`),
    );
    expect(line).toMatch(/HttpOnly/);
    expect(line).toMatch(/SameSite=Lax/);
    expect(line).toMatch(/Path=\/auth(;|$)/);
    expect(line).toMatch(new RegExp(`Max-Age=${getConfig().SIGN_IN_PENDING_MINUTES * 60}`));
  });
});

describe('caching of API answers', () => {
  it('when /api/me answers a signed-in person (with the CSRF token), then it says no-store', async () => {
    const me = await request(app).get('/api/me').set('Cookie', maren.cookie);
    expect(me.status).toBe(200);
    expect(me.headers['cache-control']).toBe('no-store');
  });

  it.each(['/api/people', '/api/sites', '/api/cabinets', '/api/access-events'])(
    'when %s answers a signed-in admin, then it says no-store',
    async (path) => {
      const res = await request(app).get(path).set('Cookie', maren.cookie);
      expect(res.status).toBe(200);
      expect(res.headers['cache-control']).toBe('no-store');
    },
  );

  it('when a bearer caller or nobody asks, or an error answers, then no-store too', async () => {
    const admin = await createCaller(['admin']);
    expect((await request(app).get('/api/people').set('Authorization', admin.auth)).headers['cache-control']).toBe('no-store');
    expect((await request(app).get('/api/me')).headers['cache-control']).toBe('no-store');
    expect((await request(app).get('/api/nothing-here').set('Authorization', admin.auth)).headers['cache-control']).toBe('no-store');
  });
});

describe('the Origin check beside the CSRF token', () => {
  const makeToken = (origin?: string, referer?: string) => {
    const req = request(app)
      .post('/api/me/tokens')
      .set('Cookie', maren.cookie)
      .set('X-CSRF-Token', maren.csrfToken);
    if (origin !== undefined) req.set('Origin', origin);
    if (referer !== undefined) req.set('Referer', referer);
    return req.send({ name: `from ${origin ?? referer ?? 'nowhere'}`, expiresInDays: 7 });
  };

  it.each(['https://evil.example', 'null', 'http://localhost.evil.example', 'https://localhost'])(
    'when a session request with the right CSRF token says Origin %s, then 403 origin-refused and nothing is made',
    async (origin) => {
      const before = await ApiToken.count();
      const res = await makeToken(origin);
      expect(res.status).toBe(403);
      expect(res.body.error.code).toBe('origin-refused');
      expect(res.body.error.message).toContain(new URL(getConfig().APP_URL).origin);
      expect(await ApiToken.count()).toBe(before);
    },
  );

  it('when Origin is absent but Referer names another site, then 403 origin-refused', async () => {
    const res = await makeToken(undefined, 'https://evil.example/page');
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('origin-refused');
  });

  it('when Origin is APP_URL’s own, then the change goes through', async () => {
    const res = await makeToken(new URL(getConfig().APP_URL).origin);
    expect(res.status).toBe(201);
  });

  it('when a bearer request has no Origin, then it goes through; with another Origin, then 403', async () => {
    const admin = await createCaller(['admin']);
    const target = await User.create({
      email: 'origin@brackenmoor.example',
      name: 'Origin Test',
      subject: 'origin-test',
      lastSignInAt: null,
    });
    const change = (roles: string[], origin?: string) => {
      const req = request(app).patch(`/api/people/${target.id}`).set('Authorization', admin.auth);
      if (origin) req.set('Origin', origin);
      return req.send({ roles });
    };
    const foreign = await change(['planner'], 'https://evil.example');
    expect(foreign.status).toBe(403);
    expect(foreign.body.error.code).toBe('origin-refused');
    await target.reload();
    expect(target.roles).toEqual([]);
    const plain = await change(['planner']);
    expect(plain.status).toBe(200);
    await target.reload();
    expect(target.roles).toEqual(['planner']);
  });

  it('when a GET comes with another Origin, then it is answered (reading changes nothing)', async () => {
    const res = await request(app).get('/api/me').set('Cookie', maren.cookie).set('Origin', 'https://evil.example');
    expect(res.status).toBe(200);
  });

  it('when the sign-out comes from another origin, then it is refused and the session lives on', async () => {
    const tomas = await signInOverHttp(app, 'tomas', 'tidewater-plan');
    const res = await request(app)
      .post('/auth/logout')
      .set('Cookie', tomas.cookie)
      .set('Origin', 'https://evil.example')
      .type('form')
      .send({ _csrf: tomas.csrfToken });
    expect(res.status).toBe(403);
    expect((await request(app).get('/api/me').set('Cookie', tomas.cookie)).status).toBe(200);
  });
});
