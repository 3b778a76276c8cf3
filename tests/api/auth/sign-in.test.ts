import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../api/src/app';
import { getConfig } from '../../../api/src/config/env';
import { AccessEvent } from '../../../api/src/models/access-event';
import { User } from '../../../api/src/models/user';
import { recordFailureInEbbline } from '../../../infra/identity/sign-in-log';
import { startTestIdentityProvider } from '../../support/identity';
import {
  agePendingSignIns,
  CookieJar,
  finishSignIn,
  sessionCookieFrom,
  signInOverHttp,
  startSignIn,
  submitSignInForm,
  visitProvider,
} from '../../support/oidc-flow';

const app = createApp();

beforeAll(async () => {
  await startTestIdentityProvider({ onSignInFailed: recordFailureInEbbline });
});

describe('GET /auth/login', () => {
  it('when started, then it redirects to the provider with code flow, PKCE S256, state, nonce and the exact redirect URI', async () => {
    const { authorizeUrl } = await startSignIn(app, '/planner');
    expect(authorizeUrl.origin).toBe(process.env.OIDC_ISSUER);
    expect(authorizeUrl.pathname).toBe('/authorize');
    const p = authorizeUrl.searchParams;
    expect(p.get('response_type')).toBe('code');
    expect(p.get('code_challenge_method')).toBe('S256');
    expect(p.get('code_challenge')).toMatch(/^[\w-]{43}$/);
    expect(p.get('state')).toMatch(/^[\w-]{20,}$/);
    expect(p.get('nonce')).toMatch(/^[\w-]{20,}$/);
    // exactly the configured one (APP_URL + /auth/callback by default)
    expect(p.get('redirect_uri')).toBe(getConfig().OIDC_REDIRECT_URL);
    expect(getConfig().OIDC_REDIRECT_URL).toBe(`${getConfig().APP_URL}/auth/callback`);
    expect(p.get('scope')?.split(' ')).toEqual(
      expect.arrayContaining(['openid', 'email', 'profile', 'roles']),
    );
  });

  it.each([
    'https://evil.example/',
    '//evil.example/x',
    '/\\evil.example',
    'planner',
    'javascript:alert(1)',
  ])('when returnTo is %s, then 400 naming returnTo', async (returnTo) => {
    const res = await request(app).get('/auth/login').query({ returnTo });
    expect(res.status).toBe(400);
    expect(res.body.error.issues[0].path).toBe('returnTo');
  });
});

describe('a sign-in through the provider', () => {
  it('when it completes, then a new session id replaces the pre-sign-in one and /api/me answers with a CSRF token', async () => {
    const signedIn = await signInOverHttp(app, 'tomas', 'tidewater-plan', '/planner?week=12');
    expect(signedIn.location).toBe('/planner?week=12');
    expect(signedIn.cookie).not.toBe(signedIn.preSignInCookie);

    const me = await request(app).get('/api/me').set('Cookie', signedIn.cookie);
    expect(me.status).toBe(200);
    expect(me.body).toEqual({
      id: expect.any(String),
      name: 'Tomas Keelan',
      email: 'tomas@brackenmoor.example',
      roles: ['planner'],
      csrfToken: expect.stringMatching(/^[\w-]{40,}$/),
    });

    // the session from before sign-in is gone, not promoted
    const old = await request(app).get('/api/me').set('Cookie', signedIn.preSignInCookie);
    expect(old.status).toBe(401);
  });

  it('when the session cookie is set, then it is HttpOnly, SameSite=Lax, path / and not Secure on http', async () => {
    const { authorizeUrl, cookie } = await startSignIn(app);
    const { callbackUrl } = await visitProvider(authorizeUrl, 'ines', 'tidewater-rel');
    const done = await finishSignIn(app, callbackUrl, cookie);
    const line = (done.headers['set-cookie'] as unknown as string[]).find((l) =>
      l.startsWith('ebbline.sid='),
    );
    expect(line).toMatch(/HttpOnly/);
    expect(line).toMatch(/SameSite=Lax/);
    expect(line).toMatch(/Path=\//);
    expect(line).not.toMatch(/Secure/);
  });

  it('when a person signs in for the first time, then Ebbline creates them with the roles of the provider’s roles claim', async () => {
    expect(await User.findOne({ where: { subject: 'dario' } })).toBeNull();
    await signInOverHttp(app, 'dario', 'tidewater-tech');
    const dario = await User.findOne({ where: { subject: 'dario' } });
    expect(dario).toMatchObject({
      email: 'dario@brackenmoor.example',
      name: 'Dario Venn',
      roles: ['technician'],
      active: true,
    });
    expect(dario?.lastSignInAt).toBeInstanceOf(Date);
    const event = await AccessEvent.findOne({ where: { kind: 'sign-in', userId: dario!.id } });
    expect(event?.detail).toMatchObject({ firstSignIn: true });
    expect(event?.userAgent).toBeTruthy();
  });

  it('when an admin has changed the roles since, then a later sign-in keeps Ebbline’s roles, not the claim’s', async () => {
    await signInOverHttp(app, 'lucia', 'tidewater-tech');
    await User.update({ roles: ['technician', 'reliability'] }, { where: { subject: 'lucia' } });
    const again = await signInOverHttp(app, 'lucia', 'tidewater-tech');
    const me = await request(app).get('/api/me').set('Cookie', again.cookie);
    expect(me.body.roles).toEqual(['technician', 'reliability']);
  });

  it('when the person has no role, then they are signed in with an empty role list', async () => {
    const noor = await signInOverHttp(app, 'noor', 'tidewater-new');
    const me = await request(app).get('/api/me').set('Cookie', noor.cookie);
    expect(me.status).toBe(200);
    expect(me.body.roles).toEqual([]);
    const fleet = await request(app).get('/api/people').set('Cookie', noor.cookie);
    expect(fleet.status).toBe(403);
  });

  it('when the person is deactivated, then the callback refuses them and records the failure', async () => {
    await signInOverHttp(app, 'kofi', 'tidewater-tech');
    await User.update({ active: false }, { where: { subject: 'kofi' } });
    const { authorizeUrl, cookie } = await startSignIn(app);
    const { callbackUrl } = await visitProvider(authorizeUrl, 'kofi', 'tidewater-tech');
    const done = await finishSignIn(app, callbackUrl, cookie);
    expect(done.status).toBe(303);
    expect(done.headers.location).toBe('/sign-in-problem?reason=deactivated');
    const after = sessionCookieFrom(done.headers['set-cookie']) ?? cookie;
    expect((await request(app).get('/api/me').set('Cookie', after)).status).toBe(401);
    const kofi = await User.findOne({ where: { subject: 'kofi' } });
    expect(await AccessEvent.count({ where: { kind: 'sign-in-failed', userId: kofi!.id } })).toBe(
      1,
    );
  });
});

describe('the callback refuses a state it did not issue', () => {
  it('when the state is tampered with, then no session is made and the person sees the sign-in problem page', async () => {
    const { authorizeUrl, cookie } = await startSignIn(app);
    const { callbackUrl } = await visitProvider(authorizeUrl, 'priya', 'tidewater-plan');
    callbackUrl.searchParams.set('state', `${callbackUrl.searchParams.get('state')}x`);
    const done = await finishSignIn(app, callbackUrl, cookie);
    expect(done.status).toBe(303);
    expect(done.headers.location).toBe('/sign-in-problem?reason=state-mismatch');
    expect((await request(app).get('/api/me').set('Cookie', cookie)).status).toBe(401);
    expect(await AccessEvent.count({ where: { kind: 'sign-in-failed' } })).toBeGreaterThan(0);
  });

  it('when the callback comes in another browser (no pending sign-in), then it is refused', async () => {
    const { authorizeUrl } = await startSignIn(app);
    const { callbackUrl } = await visitProvider(authorizeUrl, 'priya', 'tidewater-plan');
    const done = await request(app).get(callbackUrl.pathname + callbackUrl.search);
    expect(done.headers.location).toBe('/sign-in-problem?reason=state-mismatch');
  });

  it('when the same callback is replayed in the same browser, then its state is spent and the second time is refused', async () => {
    const { authorizeUrl, cookie } = await startSignIn(app);
    const { callbackUrl } = await visitProvider(authorizeUrl, 'priya', 'tidewater-plan');
    const first = await finishSignIn(app, callbackUrl, cookie);
    expect(first.headers.location).toBe('/');
    // the browser's pre-sign-in cookie after the callback: the state is no longer in it
    const jar = new CookieJar();
    jar.take(cookie.split('; ').map((pair) => `${pair}; Path=/auth`));
    jar.take(first.headers['set-cookie']);
    const second = await finishSignIn(app, callbackUrl, jar.header());
    expect(second.headers.location).toBe('/sign-in-problem?reason=state-mismatch');
  });

  it('when a copy of the old pre-sign-in cookie is replayed with the callback, then the spent code is refused and nobody is signed in', async () => {
    const { authorizeUrl, cookie } = await startSignIn(app);
    const { callbackUrl } = await visitProvider(authorizeUrl, 'priya', 'tidewater-plan');
    expect((await finishSignIn(app, callbackUrl, cookie)).headers.location).toBe('/');
    const replay = await finishSignIn(app, callbackUrl, cookie);
    expect(replay.headers.location).toBe('/sign-in-problem?reason=rejected');
    expect(sessionCookieFrom(replay.headers['set-cookie'])).toBeUndefined();
  });

  it('when the pre-sign-in cookie is altered, then it holds no sign-in and the callback is refused', async () => {
    const { authorizeUrl, cookie } = await startSignIn(app);
    const { callbackUrl } = await visitProvider(authorizeUrl, 'priya', 'tidewater-plan');
    const at = cookie.indexOf('=') + 10;
    const altered = `${cookie.slice(0, at)}${cookie[at] === 'A' ? 'B' : 'A'}${cookie.slice(at + 1)}`;
    const done = await finishSignIn(app, callbackUrl, altered);
    expect(done.headers.location).toBe('/sign-in-problem?reason=state-mismatch');
  });

  it('when the sign-in was started longer ago than SIGN_IN_PENDING_MINUTES, then its state has expired', async () => {
    const { authorizeUrl, cookie } = await startSignIn(app);
    const { callbackUrl } = await visitProvider(authorizeUrl, 'priya', 'tidewater-plan');
    // the sign-in under way, started 11 minutes earlier (SIGN_IN_PENDING_MINUTES is 10)
    const at = cookie.indexOf('=');
    const aged = `${cookie.slice(0, at)}=${agePendingSignIns(cookie.slice(at + 1), 660_000)}`;
    const done = await finishSignIn(app, callbackUrl, aged);
    expect(done.headers.location).toBe('/sign-in-problem?reason=expired');
  });

  it('when the code is tampered with, then the token exchange fails and the sign-in is rejected', async () => {
    const { authorizeUrl, cookie } = await startSignIn(app);
    const { callbackUrl } = await visitProvider(authorizeUrl, 'priya', 'tidewater-plan');
    callbackUrl.searchParams.set('code', 'not-the-code');
    const done = await finishSignIn(app, callbackUrl, cookie);
    expect(done.headers.location).toBe('/sign-in-problem?reason=rejected');
  });
});

describe('the provider’s sign-in form', () => {
  it('when the password is wrong, then it says so on the form and the failure is in Ebbline’s sign-in log', async () => {
    const { authorizeUrl } = await startSignIn(app);
    const answer = await submitSignInForm(authorizeUrl, 'rurik', 'not-his-password');
    expect(answer.status).toBe(401);
    expect(answer.page).toContain('The login or the password is wrong.');
    expect(answer.page).toContain('value="rurik"');
    expect(answer.page).not.toContain('not-his-password');
    const failure = await AccessEvent.findOne({
      where: { kind: 'sign-in-failed', login: 'rurik' },
    });
    expect(failure?.detail).toMatchObject({ reason: 'wrong-password', at: 'identity-provider' });
    expect(failure?.ip).toBeTruthy();
  });
});
