import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../api/src/app';
import { recordFailureInEbbline } from '../../../infra/identity/sign-in-log';
import { createCaller } from '../../support/auth';
import { startTestIdentityProvider } from '../../support/identity';
import { signInOverHttp, startSignIn, submitSignInForm } from '../../support/oidc-flow';

const app = createApp();

beforeAll(async () => {
  await startTestIdentityProvider({ onSignInFailed: recordFailureInEbbline });
});

describe('GET /api/access-events', () => {
  it('when people sign in, fail and sign out, then an admin sees it all, newest first, with address and browser', async () => {
    const { authorizeUrl } = await startSignIn(app);
    await submitSignInForm(authorizeUrl, 'kofi', 'wrong');
    const kofi = await signInOverHttp(app, 'kofi', 'tidewater-tech');
    await request(app)
      .post('/auth/logout')
      .set('Cookie', kofi.cookie)
      .set('X-CSRF-Token', kofi.csrfToken)
      .set('User-Agent', 'Kofi-tablet');
    const admin = await createCaller(['admin']);

    const res = await request(app).get('/api/access-events').set('Authorization', admin.auth);
    expect(res.status).toBe(200);
    const kinds = res.body.items.map((e: { kind: string }) => e.kind);
    expect(kinds).toEqual(['sign-out', 'sign-in', 'sign-in-failed']);
    const [signOut, signIn, failed] = res.body.items;
    expect(signOut).toMatchObject({
      person: { name: 'Kofi Brannock' },
      userAgent: 'Kofi-tablet',
      ip: expect.any(String),
    });
    expect(signIn.person.name).toBe('Kofi Brannock');
    expect(failed).toMatchObject({ login: 'kofi', detail: { reason: 'wrong-password' } });
    expect(new Date(signOut.at).getTime()).toBeGreaterThanOrEqual(new Date(signIn.at).getTime());
  });

  it('when filtered by kind and limited, then only those come back', async () => {
    const admin = await createCaller(['admin']);
    const res = await request(app)
      .get('/api/access-events?kind=sign-in-failed&limit=1')
      .set('Authorization', admin.auth);
    expect(res.body.items).toHaveLength(1);
    expect(res.body.items[0].kind).toBe('sign-in-failed');
  });

  it('when the kind is unknown, then 400 naming kind', async () => {
    const admin = await createCaller(['admin']);
    const res = await request(app)
      .get('/api/access-events?kind=coffee')
      .set('Authorization', admin.auth);
    expect(res.status).toBe(400);
    expect(res.body.error.issues[0].path).toBe('kind');
  });

  it('when a reliability engineer asks, then 403', async () => {
    const rel = await createCaller(['reliability']);
    expect(
      (await request(app).get('/api/access-events').set('Authorization', rel.auth)).status,
    ).toBe(403);
  });
});
