import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../api/src/app';
import { getConfig, parseConfig } from '../../../api/src/config/env';
import { sessionCookieOptions } from '../../../api/src/auth/session';
import { sequelize } from '../../../api/src/db/sequelize';
import { AccessEvent } from '../../../api/src/models/access-event';
import { startTestIdentityProvider } from '../../support/identity';
import { signInOverHttp, startSignIn, visitProvider } from '../../support/oidc-flow';

const app = createApp();

beforeAll(async () => {
  await startTestIdentityProvider();
});

async function shiftSession(cookie: string, sql: string): Promise<void> {
  const sid = decodeURIComponent(cookie.split('=')[1] ?? '')
    .replace(/^s:/, '')
    .split('.')[0];
  const [, affected] = (await sequelize.query(`UPDATE sessions SET ${sql} WHERE sid = :sid`, {
    replacements: { sid },
  })) as [unknown, { rowCount?: number }];
  expect(affected.rowCount ?? 1).toBe(1);
}

describe('POST /auth/logout', () => {
  it('when signed in, then it ends the session, clears the cookie and sends the browser to end the provider session', async () => {
    const s = await signInOverHttp(app, 'maren', 'tidewater-admin');
    const res = await request(app)
      .post('/auth/logout')
      .set('Cookie', s.cookie)
      .type('form')
      .send({ _csrf: s.csrfToken });
    expect(res.status).toBe(303);
    const target = new URL(res.headers.location as string);
    expect(target.origin + target.pathname).toBe(`${process.env.OIDC_ISSUER}/session/end`);
    expect(target.searchParams.get('id_token_hint')).toMatch(/^ey/);
    expect(target.searchParams.get('post_logout_redirect_uri')).toBe(
      getConfig().OIDC_POST_LOGOUT_REDIRECT_URL,
    );
    const cleared = (res.headers['set-cookie'] as unknown as string[]).find((l) =>
      l.startsWith('ebbline.sid='),
    );
    expect(cleared).toMatch(/Expires=Thu, 01 Jan 1970/);

    // the old cookie is worthless now
    const replay = await request(app).get('/api/me').set('Cookie', s.cookie);
    expect(replay.status).toBe(401);
    expect(replay.body.error.code).toBe('unauthenticated');
    expect(await AccessEvent.count({ where: { kind: 'sign-out' } })).toBe(1);
  });

  it('when the provider is followed to its end-session page, then its session ends too and the next sign-in asks for the password again', async () => {
    const s = await signInOverHttp(app, 'priya', 'tidewater-plan');
    const res = await request(app)
      .post('/auth/logout')
      .set('Cookie', s.cookie)
      .set('X-CSRF-Token', s.csrfToken);
    const endSession = new URL(res.headers.location as string);
    // the provider's confirmation page, then its confirm form (which the page's script submits)
    const confirmPage = await fetch(endSession, {
      headers: { cookie: s.providerJar.header() },
      redirect: 'manual',
    });
    s.providerJar.take(confirmPage.headers.getSetCookie());
    const html = await confirmPage.text();
    expect(html).toContain('Signing you out');
    const action = /action="([^"]+)"/.exec(html)?.[1] as string;
    const xsrf = /name="xsrf" value="([^"]+)"/.exec(html)?.[1] as string;
    const confirmed = await fetch(new URL(action, endSession), {
      method: 'POST',
      headers: {
        cookie: s.providerJar.header(),
        'content-type': 'application/x-www-form-urlencoded',
      },
      body: new URLSearchParams({ xsrf, logout: 'yes' }).toString(),
      redirect: 'manual',
    });
    expect(confirmed.status).toBe(303);
    expect(confirmed.headers.get('location')).toBe(getConfig().OIDC_POST_LOGOUT_REDIRECT_URL);
    s.providerJar.take(confirmed.headers.getSetCookie());

    // with the provider's cookies from before, a new sign-in must show the form again
    const { authorizeUrl } = await startSignIn(app);
    const visit = await visitProvider(authorizeUrl, 'priya', 'tidewater-plan', s.providerJar);
    expect(visit.lastPage).toContain('name="password"');
  });

  it('when the provider session still lives, then a second sign-in needs no password (single sign-on)', async () => {
    const s = await signInOverHttp(app, 'priya', 'tidewater-plan');
    const { authorizeUrl } = await startSignIn(app);
    const visit = await visitProvider(
      authorizeUrl,
      'priya',
      'wrong-but-never-asked',
      s.providerJar,
    );
    expect(visit.lastPage).toBe('');
    expect(visit.callbackUrl.searchParams.get('code')).toBeTruthy();
  });

  it('when the CSRF token is missing, then 403 and the session lives on', async () => {
    const s = await signInOverHttp(app, 'ines', 'tidewater-rel');
    const res = await request(app).post('/auth/logout').set('Cookie', s.cookie);
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('csrf-failed');
    expect((await request(app).get('/api/me').set('Cookie', s.cookie)).status).toBe(200);
  });

  it('when nobody is signed in, then it just leads to the signed-out page', async () => {
    const res = await request(app).post('/auth/logout');
    expect(res.status).toBe(303);
    expect(new URL(res.headers.location as string).pathname).toBe('/session/end');
  });
});

describe('session timeouts', () => {
  it('when a request comes, then the idle deadline moves on (rolling)', async () => {
    const s = await signInOverHttp(app, 'tomas', 'tidewater-plan');
    await shiftSession(s.cookie, "expire = now() + interval '1 minute'");
    await request(app).get('/api/me').set('Cookie', s.cookie).expect(200);
    const [rows] = (await sequelize.query('SELECT min(expire) AS e FROM sessions')) as [
      Array<{ e: Date }>,
      unknown,
    ];
    expect(new Date(rows[0]!.e).getTime()).toBeGreaterThan(Date.now() + 50 * 60_000);
  });

  it('when the session has been idle past SESSION_IDLE_MINUTES, then the cookie no longer signs in', async () => {
    const s = await signInOverHttp(app, 'tomas', 'tidewater-plan');
    await shiftSession(s.cookie, "expire = now() - interval '1 second'");
    const res = await request(app).get('/api/me').set('Cookie', s.cookie);
    expect(res.status).toBe(401);
  });

  it('when the sign-in is older than SESSION_ABSOLUTE_HOURS, then the session ends even though it was in use', async () => {
    const s = await signInOverHttp(app, 'tomas', 'tidewater-plan');
    await request(app).get('/api/me').set('Cookie', s.cookie).expect(200);
    const thirteenHoursAgo = Date.now() - 13 * 3_600_000;
    await shiftSession(
      s.cookie,
      `sess = jsonb_set(sess::jsonb, '{signedInAt}', '${thirteenHoursAgo}')::json`,
    );
    const res = await request(app).get('/api/me').set('Cookie', s.cookie);
    expect(res.status).toBe(401);
    const [rows] = (await sequelize.query(
      "SELECT count(*)::int AS n FROM sessions WHERE sess->>'userId' IS NOT NULL AND (sess->>'signedInAt')::bigint < :t",
      {
        replacements: { t: thirteenHoursAgo + 1000 },
      },
    )) as [Array<{ n: number }>, unknown];
    expect(rows[0]!.n).toBe(0);
  });
});

describe('the session cookie', () => {
  it('when APP_URL is https, then the cookie is Secure', () => {
    expect(
      sessionCookieOptions(
        parseConfig({
          APP_URL: 'https://ebbline.brackenmoor.example',
          SESSION_SECRET: 'a-long-random-secret-of-this-plant',
          OIDC_CLIENT_SECRET: 'the-plant-provider-client-secret',
        }),
      ).secure,
    ).toBe(true);
    expect(sessionCookieOptions(parseConfig({ APP_URL: 'http://localhost:3000' })).secure).toBe(
      false,
    );
  });

  it('when the idle timeout is configured, then the cookie lasts that long', () => {
    expect(sessionCookieOptions(parseConfig({ SESSION_IDLE_MINUTES: '20' })).maxAge).toBe(
      20 * 60_000,
    );
  });
});
