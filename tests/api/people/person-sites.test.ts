/**
 * The sites a person works at and their hours a week for visits: set by an admin on People,
 * shown in the people list and on one person, each change in the audit trail.
 */
import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../api/src/app';
import { sequelize } from '../../../api/src/db/sequelize';
import { AuditEntry } from '../../../api/src/models/audit-entry';
import { retireSite } from '../../../api/src/services/sites';
import { withUnitOfWork } from '../../../api/src/services/unit-of-work';
import type { AuthUser } from '../../../api/src/types/express';
import { createCaller } from '../../support/auth';
import { countRows, createActor, makeSite } from '../../support/register';
import { makePlant, planVisit } from '../planner/visits-fixtures';

const app = createApp();
let admin: Record<string, string>;
let planner: AuthUser;

beforeAll(async () => {
  admin = { Authorization: (await createCaller(['admin'])).auth };
  planner = (await createActor(['planner'])).actor;
});

async function technician() {
  return (await createCaller(['technician'], 'tech')).user;
}

const patch = (id: string, body: unknown) =>
  request(app).patch(`/api/people/${id}`).set(admin).send(body as object);

async function personSiteRows(userId: string): Promise<string[]> {
  const [rows] = await sequelize.query(
    'SELECT site_id FROM person_sites WHERE user_id = $1 ORDER BY site_id',
    { bind: [userId] },
  );
  return (rows as Array<{ site_id: string }>).map((r) => r.site_id);
}

describe('a new person', () => {
  it('when nobody has set them, then a person has no sites and 37.5 hours a week', async () => {
    const tech = await technician();
    const res = await request(app).get(`/api/people/${tech.id}`).set(admin);
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ id: tech.id, siteIds: [], sites: [], availableHoursPerWeek: 37.5 });
  });

  it('when the person does not exist, then GET answers 404', async () => {
    const res = await request(app)
      .get('/api/people/00000000-0000-4000-8000-000000000000')
      .set(admin);
    expect(res.status).toBe(404);
  });
});

describe('PATCH /api/people/:personId with siteIds', () => {
  it('when an admin sets sites, then they replace the list, show by name, and the audit trail names them', async () => {
    const tech = await technician();
    const north = await makeSite(planner, { name: 'Northfleet Works' });
    const south = await makeSite(planner, { name: 'Ashby Mill' });
    const res = await patch(tech.id, { siteIds: [north.id, south.id, north.id] });
    expect(res.status).toBe(200);
    // by site name, each once
    expect(res.body.sites.map((s: { name: string }) => s.name)).toEqual(['Ashby Mill', 'Northfleet Works']);
    expect(res.body.sites[0]).toEqual({ id: south.id, name: 'Ashby Mill', code: south.code, timeZone: 'Europe/London' });
    expect(res.body.siteIds).toEqual([south.id, north.id]);
    expect(await personSiteRows(tech.id)).toEqual([north.id, south.id].sort());

    const replaced = await patch(tech.id, { siteIds: [north.id] });
    expect(replaced.body.siteIds).toEqual([north.id]);
    expect(await personSiteRows(tech.id)).toEqual([north.id]);

    const listed = await request(app).get('/api/people').set(admin);
    const row = listed.body.items.find((p: { id: string }) => p.id === tech.id);
    expect(row).toMatchObject({ siteIds: [north.id], availableHoursPerWeek: 37.5 });

    const trail = await AuditEntry.findAll({
      where: { entityType: 'person', entityId: tech.id },
      order: [['at', 'ASC'], ['id', 'ASC']],
    });
    expect(trail).toHaveLength(2);
    expect(trail[1]!.summary).toBe(`Changed ${tech.name}: sites Northfleet Works`);
    expect(trail[1]!.before).toMatchObject({ sites: ['Ashby Mill', 'Northfleet Works'] });
    expect(trail[1]!.after).toEqual({ sites: ['Northfleet Works'], siteIds: [north.id] });
  });

  it('when an admin sends an empty list, then the person has no sites', async () => {
    const tech = await technician();
    const site = await makeSite(planner);
    await patch(tech.id, { siteIds: [site.id] }).expect(200);
    const res = await patch(tech.id, { siteIds: [] });
    expect(res.status).toBe(200);
    expect(res.body.sites).toEqual([]);
    expect(await personSiteRows(tech.id)).toEqual([]);
  });

  it('when the same sites are sent again, then nothing moves and no audit entry is added', async () => {
    const tech = await technician();
    const site = await makeSite(planner);
    await patch(tech.id, { siteIds: [site.id] }).expect(200);
    const entries = await countRows('audit_entries');
    await patch(tech.id, { siteIds: [site.id] }).expect(200);
    expect(await countRows('audit_entries')).toBe(entries);
  });

  it('when a site id is unknown, then 400 names that entry and nothing is stored', async () => {
    const tech = await technician();
    const site = await makeSite(planner);
    await patch(tech.id, { siteIds: [site.id] }).expect(200);
    const entries = await countRows('audit_entries');
    const res = await patch(tech.id, {
      siteIds: [site.id, '00000000-0000-4000-8000-000000000001'],
      availableHoursPerWeek: 20,
    });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('validation-failed');
    expect(res.body.error.issues).toEqual([{ path: 'siteIds.1', message: 'There is no site with this id.' }]);
    expect(await personSiteRows(tech.id)).toEqual([site.id]);
    expect(await countRows('audit_entries')).toBe(entries);
    const person = await request(app).get(`/api/people/${tech.id}`).set(admin);
    expect(person.body.availableHoursPerWeek).toBe(37.5);
  });

  it('when a site id is not an id at all, then 400 names the field', async () => {
    const tech = await technician();
    const res = await patch(tech.id, { siteIds: ['north'] });
    expect(res.status).toBe(400);
    expect(res.body.error.issues[0].path).toBe('siteIds.0');
    const notAList = await patch(tech.id, { siteIds: 'north' });
    expect(notAList.status).toBe(400);
    expect(notAList.body.error.issues[0].path).toBe('siteIds');
  });

  it('when a site is retired, then it cannot be added, but a person who works there keeps it', async () => {
    const tech = await technician();
    const kept = await makeSite(planner);
    const other = await makeSite(planner);
    await patch(tech.id, { siteIds: [kept.id] }).expect(200);
    await withUnitOfWork(planner, (uow) => retireSite(uow, kept.id, kept.version));
    const keeps = await patch(tech.id, { siteIds: [kept.id, other.id] });
    expect(keeps.status).toBe(200);

    const newcomer = await technician();
    const refused = await patch(newcomer.id, { siteIds: [other.id, kept.id] });
    expect(refused.status).toBe(400);
    expect(refused.body.error.issues).toEqual([
      { path: 'siteIds.1', message: 'This site is retired: choose a site in use.' },
    ]);
  });

  it('when a person is removed, then their sites go with them', async () => {
    const tech = await technician();
    const site = await makeSite(planner);
    await patch(tech.id, { siteIds: [site.id] }).expect(200);
    await sequelize.query('DELETE FROM api_tokens WHERE user_id = $1', { bind: [tech.id] });
    await sequelize.query('DELETE FROM users WHERE id = $1', { bind: [tech.id] });
    expect(await personSiteRows(tech.id)).toEqual([]);
  });
});

describe('PATCH /api/people/:personId with availableHoursPerWeek', () => {
  it('when an admin sets the hours, then they are stored to one decimal and audited', async () => {
    const tech = await technician();
    const res = await patch(tech.id, { availableHoursPerWeek: 22.5 });
    expect(res.status).toBe(200);
    expect(res.body.availableHoursPerWeek).toBe(22.5);
    const [[row]] = (await sequelize.query(
      'SELECT available_hours_per_week::text AS hours FROM users WHERE id = $1',
      { bind: [tech.id] },
    )) as [Array<{ hours: string }>, unknown];
    expect(row!.hours).toBe('22.5');
    const trail = await AuditEntry.findAll({ where: { entityType: 'person', entityId: tech.id } });
    expect(trail).toHaveLength(1);
    expect(trail[0]!.summary).toBe(`Changed ${tech.name}: 22.5 h a week available for visits`);
    expect(trail[0]!.before).toEqual({ availableHoursPerWeek: 37.5 });
    expect(trail[0]!.after).toEqual({ availableHoursPerWeek: 22.5 });
  });

  it.each([
    [-1, 'The hours a week must be at least 0.'],
    [80.5, 'The hours a week must be at most 80.'],
    [12.25, 'Give the hours a week to one decimal place at most (e.g. 37.5).'],
    ['40', 'Enter the hours a week as a number.'],
    [null, 'Enter the hours a week as a number.'],
  ])('when the hours are %j, then 400 names the field and nothing moves', async (hours, message) => {
    const tech = await technician();
    const entries = await countRows('audit_entries');
    const res = await patch(tech.id, { availableHoursPerWeek: hours });
    expect(res.status).toBe(400);
    expect(res.body.error.issues).toEqual([{ path: 'availableHoursPerWeek', message }]);
    expect(await countRows('audit_entries')).toBe(entries);
  });

  it('when the hours are 0 or 80, then both ends are accepted', async () => {
    const tech = await technician();
    expect((await patch(tech.id, { availableHoursPerWeek: 0 })).body.availableHoursPerWeek).toBe(0);
    expect((await patch(tech.id, { availableHoursPerWeek: 80 })).body.availableHoursPerWeek).toBe(80);
  });
});

describe('a change names only what it changes', () => {
  it('when only the hours are sent, then roles, access and sites stay', async () => {
    const tech = await technician();
    const site = await makeSite(planner);
    await patch(tech.id, { siteIds: [site.id] }).expect(200);
    const res = await patch(tech.id, { availableHoursPerWeek: 30 });
    expect(res.body).toMatchObject({ roles: ['technician'], active: true, siteIds: [site.id], availableHoursPerWeek: 30 });
  });

  it('when only roles are sent, then sites and hours stay and no audit entry is added', async () => {
    const tech = await technician();
    const site = await makeSite(planner);
    await patch(tech.id, { siteIds: [site.id], availableHoursPerWeek: 16 }).expect(200);
    const entries = await countRows('audit_entries');
    const res = await patch(tech.id, { roles: ['technician', 'reliability'] });
    expect(res.body).toMatchObject({ siteIds: [site.id], availableHoursPerWeek: 16 });
    expect(await countRows('audit_entries')).toBe(entries);
  });

  it('when the body names nothing, then 400 says what may be sent', async () => {
    const tech = await technician();
    const res = await patch(tech.id, {});
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/siteIds or availableHoursPerWeek/);
  });
});

describe('who may', () => {
  it.each([['planner'], ['technician'], ['reliability']] as const)(
    'when a %s sets sites or hours, then 403 and nothing moves',
    async (role) => {
      const tech = await technician();
      const site = await makeSite(planner);
      const caller = await createCaller([role]);
      const res = await request(app)
        .patch(`/api/people/${tech.id}`)
        .set('Authorization', caller.auth)
        .send({ siteIds: [site.id], availableHoursPerWeek: 10 });
      expect(res.status).toBe(403);
      expect(await personSiteRows(tech.id)).toEqual([]);
      const read = await request(app).get(`/api/people/${tech.id}`).set('Authorization', caller.auth);
      expect(read.status).toBe(403);
    },
  );
});

describe('what a technician reads follows their sites', () => {
  it('when an admin gives a technician a site and takes it away, then the visits there are readable and then 404', async () => {
    const plant = await makePlant();
    const visit = await planVisit(app, plant);
    // the outsider works at the other site only: Ana's visit is not theirs to read
    const asOutsider = () =>
      request(app).get(`/api/visits/${visit.id}`).set('Authorization', plant.outsider.auth);
    expect((await asOutsider()).status).toBe(404);

    await patch(plant.outsider.user.id, { siteIds: [plant.otherSite.id, plant.site.id] }).expect(200);
    const read = await asOutsider();
    expect(read.status).toBe(200);
    expect(read.body.id).toBe(visit.id);
    const listed = await request(app)
      .get(`/api/visits?siteId=${plant.site.id}`)
      .set('Authorization', plant.outsider.auth);
    expect(listed.body.items.map((v: { id: string }) => v.id)).toContain(visit.id);
    // reading is not changing: the visit stays Ana's to start
    const start = await request(app)
      .post(`/api/visits/${visit.id}/transitions`)
      .set('Authorization', plant.outsider.auth)
      .send({ action: 'start', version: visit.version });
    expect(start.status).toBe(403);

    await patch(plant.outsider.user.id, { siteIds: [plant.otherSite.id] }).expect(200);
    expect((await asOutsider()).status).toBe(404);
  });
});
