/**
 * The local identity provider while its database is away: every page and the token endpoint
 * answer a passing 503 with Retry-After, never a 500, and the page says so in plain words.
 */
import crypto from 'node:crypto';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createAccountStore } from '../../../infra/identity/accounts';
import { generateSigningKey } from '../../../infra/identity/keys';
import { createIdentityProvider } from '../../../infra/identity/provider';
import { memoryStore, type AdapterFactory } from '../../../infra/identity/stores';
import { DEMO_PEOPLE } from '../../../infra/seed/people';
import { CookieJar } from '../../support/oidc-flow';

const APP = 'http://localhost:39998';
let issuer: string;
let server: http.Server;

/** What node-postgres throws while PostgreSQL is stopped. */
const refused = () =>
  Object.assign(new Error('connect ECONNREFUSED 127.0.0.1:5433'), { code: 'ECONNREFUSED' });
/** Records in memory that can be made unreachable, as the PostgreSQL store is in an outage. */
let databaseDown = false;
const records = memoryStore();
const switchable: AdapterFactory = (model) => {
  const real = records.adapter(model);
  const guard =
    <A extends unknown[], R>(method: (...args: A) => Promise<R>) =>
    (...args: A): Promise<R> =>
      databaseDown ? Promise.reject(refused()) : method(...args);
  return {
    upsert: guard(real.upsert.bind(real)),
    find: guard(real.find.bind(real)),
    findByUid: guard(real.findByUid.bind(real)),
    findByUserCode: guard(real.findByUserCode.bind(real)),
    consume: guard(real.consume.bind(real)),
    destroy: guard(real.destroy.bind(real)),
    revokeByGrantId: guard(real.revokeByGrantId.bind(real)),
  };
};

function authorizeUrl(): URL {
  const url = new URL('/authorize', issuer);
  url.search = new URLSearchParams({
    client_id: 'ebbline',
    response_type: 'code',
    scope: 'openid email profile roles',
    redirect_uri: `${APP}/auth/callback`,
    state: crypto.randomBytes(8).toString('hex'),
    nonce: crypto.randomBytes(8).toString('hex'),
    code_challenge: crypto.createHash('sha256').update('v'.repeat(43)).digest('base64url'),
    code_challenge_method: 'S256',
  }).toString();
  return url;
}

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
    adapter: switchable,
  });
  server.on('request', app);
}, 30_000);

afterAll(async () => {
  await new Promise<void>((resolve) => {
    server.close(() => resolve());
    server.closeAllConnections();
  });
});

describe('the sign-in service while its database is away', () => {
  it('when a browser starts a sign-in, then 503 with Retry-After and a page that says to try again in a moment', async () => {
    databaseDown = true;
    const res = await fetch(authorizeUrl(), {
      redirect: 'manual',
      headers: { accept: 'text/html' },
    });
    expect(res.status).toBe(503);
    expect(res.headers.get('retry-after')).toMatch(/^\d+$/);
    expect(await res.text()).toContain('reach its database');
  });

  it('when the sign-in form of a sign-in begun before the outage is opened, then 503 with Retry-After, not 500', async () => {
    databaseDown = false;
    const jar = new CookieJar();
    const begun = await fetch(authorizeUrl(), { redirect: 'manual' });
    jar.take(begun.headers.getSetCookie());
    expect(begun.status).toBe(303);
    databaseDown = true;
    const res = await fetch(new URL(begun.headers.get('location')!, issuer), {
      headers: { cookie: jar.header(), accept: 'text/html' },
    });
    expect(res.status).toBe(503);
    expect(res.headers.get('retry-after')).toMatch(/^\d+$/);
    expect(await res.text()).toContain('reach its database');
  });

  it('when Ebbline redeems a code, then the token endpoint answers 503 with Retry-After, not 500', async () => {
    databaseDown = true;
    const res = await fetch(new URL('/token', issuer), {
      method: 'POST',
      headers: {
        'content-type': 'application/x-www-form-urlencoded',
        authorization: `Basic ${Buffer.from('ebbline:secret').toString('base64')}`,
      },
      body: new URLSearchParams({
        grant_type: 'authorization_code',
        code: 'some-code',
        redirect_uri: `${APP}/auth/callback`,
        code_verifier: 'v'.repeat(43),
      }).toString(),
    });
    expect(res.status).toBe(503);
    expect(res.headers.get('retry-after')).toMatch(/^\d+$/);
  });
});
