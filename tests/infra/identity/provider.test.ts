/** The local identity provider over HTTP, with records in memory (no database needed). */
import crypto from 'node:crypto';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createAccountStore } from '../../../infra/identity/accounts';
import { generateSigningKey } from '../../../infra/identity/keys';
import { createIdentityProvider, type SignInFailure } from '../../../infra/identity/provider';
import { memoryStore } from '../../../infra/identity/stores';
import { DEMO_PEOPLE } from '../../../infra/seed/people';
import { CookieJar } from '../../support/oidc-flow';

/** `a=1; b=2` as the Set-Cookie lines a jar takes. */
const start = (cookieHeader: string) => cookieHeader.split('; ').filter(Boolean);

const APP = 'http://localhost:39999';
let issuer: string;
let server: http.Server;
const failures: SignInFailure[] = [];

beforeAll(async () => {
  server = http.createServer();
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  issuer = `http://localhost:${(server.address() as AddressInfo).port}`;
  const { app } = createIdentityProvider({
    issuer,
    clients: [
      {
        clientId: 'ebbline',
        clientSecret: 'secret',
        clientName: 'Ebbline',
        redirectUris: [`${APP}/auth/callback`],
        postLogoutRedirectUris: [`${APP}/signed-out`],
        firstParty: true,
      },
    ],
    accounts: await createAccountStore(DEMO_PEOPLE, 4),
    signingKeys: [generateSigningKey()],
    cookieKeys: ['unit-test-key'],
    adapter: memoryStore().adapter,
    maxFailedAttempts: 3,
    lockoutMinutes: 15,
    onSignInFailed: (f) => void failures.push(f),
  });
  server.on('request', app);
});

afterAll(async () => {
  await new Promise<void>((resolve) => {
    server.close(() => resolve());
    server.closeAllConnections();
  });
});

let lastVerifier = '';

function authorizeUrl(extra: Record<string, string> = {}): URL {
  const url = new URL('/authorize', issuer);
  const verifier = crypto.randomBytes(32).toString('base64url');
  lastVerifier = verifier;
  url.search = new URLSearchParams({
    client_id: 'ebbline',
    response_type: 'code',
    scope: 'openid email profile roles',
    redirect_uri: `${APP}/auth/callback`,
    state: crypto.randomBytes(16).toString('base64url'),
    nonce: crypto.randomBytes(16).toString('base64url'),
    code_challenge: crypto.createHash('sha256').update(verifier).digest('base64url'),
    code_challenge_method: 'S256',
    ...extra,
  }).toString();
  return url;
}

/** Opens the sign-in form: its URL and the cookies a browser would hold. */
async function openForm(): Promise<{
  formUrl: URL;
  cookie: string;
  html: string;
  headers: Headers;
}> {
  const start = await fetch(authorizeUrl(), { redirect: 'manual' });
  const formUrl = new URL(start.headers.get('location') as string, issuer);
  const cookie = start.headers
    .getSetCookie()
    .map((c) => c.split(';')[0])
    .join('; ');
  const page = await fetch(formUrl, { headers: { cookie } });
  return { formUrl, cookie, html: await page.text(), headers: page.headers };
}

function post(formUrl: URL, cookie: string, login: string, password: string) {
  return fetch(new URL(`${formUrl.pathname}/login`, issuer), {
    method: 'POST',
    headers: { cookie, 'content-type': 'application/x-www-form-urlencoded' },
    body: new URLSearchParams({ login, password }).toString(),
    redirect: 'manual',
  });
}

describe('discovery', () => {
  it('when asked, then it offers the roles scope and claim, code flow only and S256 PKCE', async () => {
    const meta = await (await fetch(`${issuer}/.well-known/openid-configuration`)).json();
    expect(meta.issuer).toBe(issuer);
    expect(meta.scopes_supported).toEqual(
      expect.arrayContaining(['openid', 'email', 'profile', 'roles']),
    );
    expect(meta.claims_supported).toEqual(expect.arrayContaining(['roles', 'email', 'name']));
    expect(meta.response_types_supported).toEqual(['code']);
    expect(meta.code_challenge_methods_supported).toEqual(['S256']);
    expect(meta.end_session_endpoint).toBe(`${issuer}/session/end`);
  });
});

describe('authorization requests', () => {
  it('when PKCE is left out, then the request is refused, even for a confidential client', async () => {
    const url = authorizeUrl();
    url.searchParams.delete('code_challenge');
    url.searchParams.delete('code_challenge_method');
    const res = await fetch(url, { redirect: 'manual' });
    const location = new URL(res.headers.get('location') as string);
    expect(location.origin + location.pathname).toBe(`${APP}/auth/callback`);
    expect(location.searchParams.get('error')).toBe('invalid_request');
    expect(location.searchParams.get('error_description')).toMatch(/PKCE/);
  });

  it('when the redirect URI is not exactly the registered one, then the provider shows its own error page', async () => {
    const res = await fetch(authorizeUrl({ redirect_uri: `${APP}/auth/callback/` }), {
      redirect: 'manual',
    });
    expect(res.status).toBe(400);
    const html = await res.text();
    expect(html).toContain('Sign-in could not go on');
    expect(html).toContain('/assets/sign-in.css');
  });
});

describe('the sign-in page', () => {
  it('when opened, then it is Ebbline’s own page: own stylesheet and fonts, no outside address, strict CSP', async () => {
    const { html, headers } = await openForm();
    expect(html).toContain('<h1>Sign in</h1>');
    expect(html).toContain('href="/assets/sign-in.css"');
    expect(html).not.toMatch(/(src|href)="https?:/);
    const csp = headers.get('content-security-policy') ?? '';
    expect(csp).toContain("script-src 'self'");
    expect(csp).toContain(`form-action 'self' ${APP}`);
    expect(headers.get('cache-control')).toBe('no-store');

    const css = await (await fetch(`${issuer}/assets/sign-in.css`)).text();
    expect(css).toContain("url('/assets/fonts/noto-sans-latin-400-normal.woff2')");
    const font = await fetch(`${issuer}/assets/fonts/noto-sans-latin-400-normal.woff2`);
    expect(font.status).toBe(200);
    expect(font.headers.get('content-type')).toBe('font/woff2');
    expect((await fetch(`${issuer}/assets/fonts/..%2f..%2fpackage.json`)).status).toBe(404);
  });

  it('when the interaction is unknown or its cookie is missing, then a plain “expired” page, not a developer page', async () => {
    const res = await fetch(`${issuer}/interaction/not-a-real-one`);
    expect(res.status).toBe(400);
    expect(await res.text()).toContain('This sign-in page has expired');
  });

  it('when the password is wrong, then the form says so, keeps the login and reports the failure', async () => {
    const { formUrl, cookie } = await openForm();
    const res = await post(formUrl, cookie, 'priya', 'nope');
    expect(res.status).toBe(401);
    const html = await res.text();
    expect(html).toContain('The login or the password is wrong.');
    expect(html).toContain('value="priya"');
    expect(failures.at(-1)).toMatchObject({ login: 'priya', reason: 'wrong-password' });
  });

  it('when a login is unknown, then the message is the same as for a wrong password', async () => {
    const { formUrl, cookie } = await openForm();
    const html = await (await post(formUrl, cookie, 'nobody', 'nope')).text();
    expect(html).toContain('The login or the password is wrong.');
  });

  it('when the failures reach the limit, then the login is paused, even for the right password', async () => {
    const { formUrl, cookie } = await openForm();
    for (let i = 0; i < 2; i++)
      expect((await post(formUrl, cookie, 'rurik', 'wrong')).status).toBe(401);
    const third = await post(formUrl, cookie, 'rurik', 'wrong');
    expect(third.status).toBe(429);
    expect(await third.text()).toContain('Too many failed attempts.');
    const right = await post(formUrl, cookie, 'rurik', 'tidewater-rel');
    expect(right.status).toBe(429);
    expect(Number(right.headers.get('retry-after'))).toBeGreaterThan(800);
    expect(failures.at(-1)).toMatchObject({ login: 'rurik', reason: 'locked-out' });
    // others are not affected
    const other = await post(formUrl, cookie, 'ines', 'tidewater-rel');
    expect(other.status).toBe(303);
  });

  it('when the password is right, then consent for Ebbline is given without a page and the browser returns with a code', async () => {
    const { formUrl, cookie } = await openForm();
    const signedIn = await post(formUrl, cookie, 'maren', 'tidewater-admin');
    expect(signedIn.status).toBe(303);
    const jar = new CookieJar();
    jar.take(start(cookie));
    jar.take(signedIn.headers.getSetCookie());
    let url = new URL(signedIn.headers.get('location') as string, issuer);
    for (let hop = 0; hop < 6 && url.origin === issuer; hop++) {
      const res = await fetch(url, { headers: { cookie: jar.header() }, redirect: 'manual' });
      expect(res.status).toBeGreaterThanOrEqual(300);
      jar.take(res.headers.getSetCookie());
      url = new URL(res.headers.get('location') as string, url);
    }
    expect(url.origin + url.pathname).toBe(`${APP}/auth/callback`);
    expect(url.searchParams.get('code')).toBeTruthy();

    // the ID token carries the roles claim with e-mail and name
    const tokens = await fetch(`${issuer}/token`, {
      method: 'POST',
      headers: {
        authorization: `Basic ${Buffer.from('ebbline:secret').toString('base64')}`,
        'content-type': 'application/x-www-form-urlencoded',
      },
      body: new URLSearchParams({
        grant_type: 'authorization_code',
        code: url.searchParams.get('code') as string,
        redirect_uri: `${APP}/auth/callback`,
        code_verifier: lastVerifier,
      }).toString(),
    });
    expect(tokens.status).toBe(200);
    const { id_token: idToken } = (await tokens.json()) as { id_token: string };
    const claims = JSON.parse(
      Buffer.from(idToken.split('.')[1] as string, 'base64url').toString('utf8'),
    );
    expect(claims).toMatchObject({
      iss: issuer,
      aud: 'ebbline',
      sub: 'maren',
      name: 'Maren Oyelaran',
      email: 'maren@brackenmoor.example',
      email_verified: true,
      roles: ['admin'],
    });
    expect(
      JSON.parse(Buffer.from(idToken.split('.')[0] as string, 'base64url').toString('utf8')).alg,
    ).toBe('RS256');
  });
});
