/**
 * The people and API-token writes against careless and hostile input: a change to a person
 * changes only what it names, and a corpus of bodies never gets a 5xx and stores nothing when
 * refused.
 */
import fc from 'fast-check';
import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../api/src/app';
import { User } from '../../../api/src/models/user';
import { ROLES } from '../../../shared/constants/roles';
import { createCaller } from '../../support/auth';
import { createActor, makeSite } from '../../support/register';
import { assertChangesOnlyWhatTheyName } from '../../support/change-property';
import { assertCorpusHolds, type CorpusTarget } from '../../support/hostile-bodies';
import { startTestIdentityProvider } from '../../support/identity';
import { signInOverHttp, type SignedInSession } from '../../support/oidc-flow';

const app = createApp();
let admin: Record<string, string>;
let tomas: SignedInSession;
let session: Record<string, string>;

beforeAll(async () => {
  admin = { Authorization: (await createCaller(['admin'])).auth };
  await startTestIdentityProvider();
  tomas = await signInOverHttp(app, 'tomas', 'tidewater-plan');
  session = { Cookie: tomas.cookie, 'X-CSRF-Token': tomas.csrfToken };
  const me = await request(app).get('/api/me').set('Cookie', tomas.cookie);
  await User.update({ roles: ['planner', 'reliability'] }, { where: { id: me.body.id } });
}, 60_000);

async function personById(id: string): Promise<Record<string, unknown>> {
  const res = await request(app).get('/api/people').set(admin);
  return (res.body.items as Array<Record<string, unknown>>).find((p) => p.id === id)!;
}

describe('a change changes only what it names', () => {
  it('when a change to a person names roles, active, sites or hours alone, then the others stay as they were', async () => {
    const person = (await createCaller(['planner'])).user;
    const { actor } = await createActor(['planner']);
    const siteIds = [(await makeSite(actor)).id, (await makeSite(actor)).id, (await makeSite(actor)).id];
    await assertChangesOnlyWhatTheyName(app, {
      path: `/api/people/${person.id}`,
      headers: admin,
      fields: {
        roles: fc.subarray([...ROLES]),
        active: fc.boolean(),
        siteIds: fc.subarray(siteIds),
        availableHoursPerWeek: fc.integer({ min: 0, max: 800 }).map((tenths) => tenths / 10),
      },
      follows: { siteIds: ['sites'] },
      read: () => personById(person.id),
    });
  }, 120_000);
});

describe('a corpus of hostile bodies never gets a 5xx and stores nothing when refused', () => {
  it('PATCH /api/people/:id', async () => {
    const person = (await createCaller(['technician'])).user;
    const site = await makeSite((await createActor(['planner'])).actor);
    const tally = await assertCorpusHolds(
      app,
      { method: 'patch', path: `/api/people/${person.id}`, headers: admin },
      { roles: ['planner', 'technician'], active: true, siteIds: [site.id], availableHoursPerWeek: 30 },
    );
    expect(tally[200]).toBeGreaterThan(0);
  }, 300_000);

  it('POST /api/me/tokens (a browser session)', async () => {
    const tally = await assertCorpusHolds(
      app,
      { method: 'post', path: '/api/me/tokens', headers: session },
      { name: 'Logger gateway', expiresInDays: 30, roles: ['planner'] },
    );
    expect(tally[201]).toBeGreaterThan(0);
  }, 300_000);

  it('DELETE /api/me/tokens/:id (a browser session)', async () => {
    const token = await request(app)
      .post('/api/me/tokens')
      .set(session)
      .send({ name: 'To revoke', expiresInDays: 7 });
    expect(token.status).toBe(201);
    const target = async (): Promise<CorpusTarget> => ({ version: 1, id: token.body.id });
    await assertCorpusHolds(
      app,
      {
        method: 'delete',
        path: (q, t) => `/api/me/tokens/${q.length % 2 ? t.id : q}`,
        headers: session,
        target,
      },
      { reason: 'done' },
    );
  }, 300_000);
});
