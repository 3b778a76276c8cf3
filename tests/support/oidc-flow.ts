/**
 * A sign-in through the real provider over HTTP, step by step as a browser does it, for API
 * tests: the app through supertest, the provider through fetch, each with its own cookies.
 */
import type { Express } from 'express';
import request from 'supertest';
import { sealPendingSignIns, unsealPendingSignIns } from '../../api/src/auth/pending-sign-in';
import { getConfig } from '../../api/src/config/env';

/** The app in this process, or the base URL of one running as its own process. */
export type AppUnderTest = Express | string;

/** The browser the tests pretend to be, as the sign-in log records it. */
export const TEST_USER_AGENT = 'Mozilla/5.0 (Ebbline API tests)';

/** Cookies by name, as a browser keeps them for one host (paths ignored: harmless here). */
export class CookieJar {
  private readonly cookies = new Map<string, string>();

  /** Takes the Set-Cookie lines of a response; an expired cookie is removed. */
  take(setCookie: string[] | string | undefined): void {
    for (const line of Array.isArray(setCookie) ? setCookie : setCookie ? [setCookie] : []) {
      const [pair = '', ...attributes] = line.split(';');
      const at = pair.indexOf('=');
      const name = pair.slice(0, at).trim();
      const value = pair.slice(at + 1).trim();
      const expired = attributes.some((a) => {
        const [key = '', v = ''] = a.trim().split('=');
        return (
          (key.toLowerCase() === 'expires' && new Date(v).getTime() <= Date.now()) ||
          (key.toLowerCase() === 'max-age' && Number(v) <= 0)
        );
      });
      if (expired || value === '') this.cookies.delete(name);
      else this.cookies.set(name, value);
    }
  }

  get(name: string): string | undefined {
    return this.cookies.get(name);
  }

  header(): string {
    return [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; ');
  }
}

/** `ebbline.sid=…` as a Cookie header, from a response's Set-Cookie (or undefined). */
export function sessionCookieFrom(setCookie: string[] | string | undefined): string | undefined {
  const name = getConfig().SESSION_COOKIE_NAME;
  const lines = Array.isArray(setCookie) ? setCookie : setCookie ? [setCookie] : [];
  const line = lines.find((l) => l.startsWith(`${name}=`));
  return line?.split(';')[0];
}

/** The cookies of a response's Set-Cookie as one Cookie header (`a=1; b=2`), or undefined. */
export function cookieHeaderFrom(setCookie: string[] | string | undefined): string | undefined {
  const lines = Array.isArray(setCookie) ? setCookie : setCookie ? [setCookie] : [];
  const pairs = lines.map((l) => l.split(';')[0]!.trim()).filter((p) => !p.endsWith('='));
  return pairs.length ? pairs.join('; ') : undefined;
}

/**
 * GET /auth/login: the provider's authorization URL and the pre-sign-in cookie (the sealed
 * sign-ins under way, api/src/auth/pending-sign-in.ts; no session exists before sign-in).
 */
export async function startSignIn(
  app: AppUnderTest,
  returnTo?: string,
): Promise<{ authorizeUrl: URL; cookie: string }> {
  const res = await request(app)
    .get('/auth/login')
    .query(returnTo === undefined ? {} : { returnTo });
  if (res.status !== 303) throw new Error(`GET /auth/login answered ${res.status}: ${res.text}`);
  const cookie = cookieHeaderFrom(res.headers['set-cookie']);
  if (!cookie) throw new Error('GET /auth/login set no sign-in cookie');
  return { authorizeUrl: new URL(res.headers.location as string), cookie };
}

async function providerRequest(
  jar: CookieJar,
  url: URL,
  init: RequestInit = {},
): Promise<Response> {
  const res = await fetch(url, {
    ...init,
    redirect: 'manual',
    headers: { ...(init.headers ?? {}), cookie: jar.header() },
  });
  jar.take(res.headers.getSetCookie());
  return res;
}

export interface ProviderVisit {
  /** Where the provider finally sends the browser: the app's callback with code and state. */
  callbackUrl: URL;
  /** The provider's cookies (its session), for a later visit. */
  jar: CookieJar;
  /** HTML of the last provider page shown (the form after a wrong password). */
  lastPage: string;
}

/**
 * Follows the provider from the authorization URL: the sign-in form (filled in when the
 * provider asks), then consent (automatic for Ebbline), until it redirects to the app.
 * @throws when the provider shows a page again (wrong password): see `lastPage`
 */
export async function visitProvider(
  authorizeUrl: URL,
  login: string,
  password: string,
  jar = new CookieJar(),
): Promise<ProviderVisit> {
  const appCallback = getConfig().OIDC_REDIRECT_URL;
  let url = authorizeUrl;
  let lastPage = '';
  let submitted = false;
  for (let hop = 0; hop < 20; hop++) {
    const res = await providerRequest(jar, url);
    if (res.status >= 300 && res.status < 400) {
      const next = new URL(res.headers.get('location') as string, url);
      if (next.href.startsWith(appCallback)) return { callbackUrl: next, jar, lastPage };
      url = next;
      continue;
    }
    lastPage = await res.text();
    const action = /<form method="post" action="([^"]+\/login)"/.exec(lastPage)?.[1];
    if (res.status !== 200 || !action || submitted) {
      throw Object.assign(new Error(`the provider stopped at ${url.pathname} (${res.status})`), {
        page: lastPage,
        status: res.status,
      });
    }
    submitted = true;
    const posted = await providerRequest(jar, new URL(action, url), {
      method: 'POST',
      headers: { 'content-type': 'application/x-www-form-urlencoded' },
      body: new URLSearchParams({ login, password }).toString(),
    });
    if (posted.status !== 303) {
      lastPage = await posted.text();
      throw Object.assign(new Error(`sign-in form answered ${posted.status}`), {
        page: lastPage,
        status: posted.status,
      });
    }
    url = new URL(posted.headers.get('location') as string, url);
  }
  throw new Error('the provider redirected too often');
}

/** Posts the sign-in form once and returns the provider's answer (for wrong passwords). */
export async function submitSignInForm(
  authorizeUrl: URL,
  login: string,
  password: string,
  jar = new CookieJar(),
): Promise<{ status: number; page: string }> {
  let url = authorizeUrl;
  for (let hop = 0; hop < 5; hop++) {
    const res = await providerRequest(jar, url);
    if (res.status >= 300 && res.status < 400) {
      url = new URL(res.headers.get('location') as string, url);
      continue;
    }
    const page = await res.text();
    const action = /<form method="post" action="([^"]+\/login)"/.exec(page)?.[1];
    if (!action) throw new Error(`no sign-in form at ${url.pathname}`);
    const posted = await providerRequest(jar, new URL(action, url), {
      method: 'POST',
      headers: { 'content-type': 'application/x-www-form-urlencoded' },
      body: new URLSearchParams({ login, password }).toString(),
    });
    return { status: posted.status, page: await posted.text() };
  }
  throw new Error('no sign-in form reached');
}

/** GET /auth/callback as the browser would, with the pre-sign-in cookie. */
export function finishSignIn(app: AppUnderTest, callbackUrl: URL, cookie: string) {
  return request(app)
    .get(callbackUrl.pathname + callbackUrl.search)
    .set('Cookie', cookie)
    .set('User-Agent', TEST_USER_AGENT);
}

export interface SignedInSession {
  /** The signed-in session cookie (`ebbline.sid=…`). */
  cookie: string;
  /** The cookie from before sign-in (the sign-in under way), which signs nobody in. */
  preSignInCookie: string;
  csrfToken: string;
  /** Where the callback sent the browser. */
  location: string;
  providerJar: CookieJar;
}

/** The whole sign-in, then GET /api/me for the CSRF token. */
export async function signInOverHttp(
  app: AppUnderTest,
  login: string,
  password: string,
  returnTo?: string,
): Promise<SignedInSession> {
  const { authorizeUrl, cookie: preSignInCookie } = await startSignIn(app, returnTo);
  const { callbackUrl, jar } = await visitProvider(authorizeUrl, login, password);
  const done = await finishSignIn(app, callbackUrl, preSignInCookie);
  const cookie = sessionCookieFrom(done.headers['set-cookie']);
  if (done.status !== 303 || !cookie)
    throw new Error(`callback answered ${done.status} ${done.headers.location ?? ''}`);
  const me = await request(app).get('/api/me').set('Cookie', cookie);
  if (me.status !== 200) throw new Error(`GET /api/me after sign-in answered ${me.status}`);
  return {
    cookie,
    preSignInCookie,
    csrfToken: me.body.csrfToken,
    location: done.headers.location as string,
    providerJar: jar,
  };
}

/**
 * The pre-sign-in cookie with every sign-in under way started `ms` earlier: re-sealed with the
 * app's own key, as if the person had spent that long at the provider.
 */
export function agePendingSignIns(cookieValue: string, ms: number): string {
  const aged = unsealPendingSignIns(cookieValue).map((p) => ({ ...p, startedAt: p.startedAt - ms }));
  if (aged.length === 0) throw new Error('the cookie holds no sign-in under way');
  return sealPendingSignIns(aged);
}
