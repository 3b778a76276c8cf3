/**
 * A person's calendar feed: the secret address made, shown once and turned off from the
 * profile, and the feed itself read back by an independent iCalendar parser (ical.js), as a
 * calendar app would: events, their times with zones (the instant worked out from the feed's
 * own VTIMEZONE), and the description's cabinet, banks, window and discharge caution.
 */
import ICAL from 'ical.js';
import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { DISCHARGE_CAUTION } from '../../../shared/constants/safety';
import { createApp } from '../../../api/src/app';
import { sequelize } from '../../../api/src/db/sequelize';
import { CalendarFeed } from '../../../api/src/models/calendar-feed';
import { User } from '../../../api/src/models/user';
import { calendarFeedHash } from '../../../api/src/services/calendar-feeds';
import { withoutFeedSecret } from '../../../api/src/routes/calendar-feed/hide-secret';
import type { AuthUser } from '../../../api/src/types/express';
import { startTestIdentityProvider } from '../../support/identity';
import { signInOverHttp, type SignedInSession } from '../../support/oidc-flow';
import { makePlace, storeVisit } from '../../support/planner-visits';
import { createCaller } from '../../support/auth';
import { createActor } from '../../support/register';

const app = createApp();
const HOUR_MS = 3_600_000;

let dario: SignedInSession;
let darioId: string;
let lucia: SignedInSession;
let luciaId: string;
let planner: AuthUser;

const me = async (session: SignedInSession) =>
  (await request(app).get('/api/me').set('Cookie', session.cookie)).body.id as string;

const post = (session: SignedInSession) =>
  request(app)
    .post('/api/me/calendar-feed')
    .set('Cookie', session.cookie)
    .set('X-CSRF-Token', session.csrfToken)
    .send({});

const remove = (session: SignedInSession) =>
  request(app)
    .delete('/api/me/calendar-feed')
    .set('Cookie', session.cookie)
    .set('X-CSRF-Token', session.csrfToken);

/** GET the feed at a made address (its path below APP_URL). */
const fetchFeed = (url: string) => request(app).get(new URL(url).pathname);

/** The UTC instant of a local wall time in a zone with a fixed offset (hours) that day. */
const utcOf = (year: number, month: number, day: number, hour: number, offsetHours: number) =>
  new Date(Date.UTC(year, month - 1, day, hour) - offsetHours * HOUR_MS);

/**
 * The next 15 January and 15 July at least two days ahead: inside the feed's 400 days ahead
 * whenever the test runs. Europe/Berlin is on CET (+1 h) in January and CEST (+2 h) in July
 * (EU summer time: last Sunday of March to last Sunday of October; common knowledge).
 */
function nextDay(month: number, day = 15): { year: number; month: number; day: number } {
  const soon = Date.now() + 2 * 24 * HOUR_MS;
  let year = new Date(soon).getUTCFullYear();
  if (Date.UTC(year, month - 1, day) < soon) year += 1;
  return { year, month, day };
}
const winter = nextDay(1);
const summer = nextDay(7);

interface Fixture {
  berlin: Awaited<ReturnType<typeof makePlace>>;
  kolkata: Awaited<ReturnType<typeof makePlace>>;
  winterVisitId: string;
  summerVisitId: string;
  cancelledVisitId: string;
  kolkataVisitId: string;
  othersVisitId: string;
}
let fx: Fixture;

async function storeWindow(
  areaId: string,
  title: string,
  startsAt: Date,
  endsAt: Date,
  recurrence: string | null,
) {
  await sequelize.query(
    `INSERT INTO shutdown_windows (area_id, title, starts_at, ends_at, recurrence)
     VALUES (:areaId, :title, :startsAt, :endsAt, :recurrence)`,
    {
      replacements: {
        areaId,
        title,
        startsAt: startsAt.toISOString(),
        endsAt: endsAt.toISOString(),
        recurrence,
      },
    },
  );
}

beforeAll(async () => {
  await startTestIdentityProvider();
  dario = await signInOverHttp(app, 'dario', 'tidewater-tech');
  darioId = await me(dario);
  lucia = await signInOverHttp(app, 'lucia', 'tidewater-tech');
  luciaId = await me(lucia);
  await User.update({ roles: ['technician'] }, { where: { id: [darioId, luciaId] } });
  planner = (await createActor(['planner'])).actor;

  const berlin = await makePlace(planner, 'Europe/Berlin');
  const kolkata = await makePlace(planner, 'Asia/Kolkata');
  // a one-off winter shutdown 05:00–15:00 Berlin (CET, +1) on the winter day
  await storeWindow(
    berlin.area.id,
    'Winter line stop',
    utcOf(winter.year, winter.month, winter.day, 5, 1),
    utcOf(winter.year, winter.month, winter.day, 15, 1),
    null,
  );
  // a weekly shutdown 05:00–15:00 Berlin (CEST, +2), first two weeks before the summer day
  const firstSummer = new Date(
    utcOf(summer.year, summer.month, summer.day, 5, 2).getTime() - 14 * 24 * HOUR_MS,
  );
  await storeWindow(
    berlin.area.id,
    'Summer weekly stop',
    firstSummer,
    new Date(firstSummer.getTime() + 10 * HOUR_MS),
    'FREQ=WEEKLY;COUNT=8',
  );

  const visit = (
    place: typeof berlin,
    start: Date,
    hours: number,
    technicianIds: string[],
    extra = {},
  ) =>
    storeVisit({
      cabinetId: place.cabinet.id,
      bankIds: place.banks.map((b) => b.id),
      technicianIds,
      plannedStartAt: start,
      plannedEndAt: new Date(start.getTime() + hours * HOUR_MS),
      ...extra,
    });
  const winterVisit = await visit(
    berlin,
    utcOf(winter.year, winter.month, winter.day, 6, 1),
    2,
    [darioId, luciaId],
    {
      notes: 'Bring the 1000 V probe set',
    },
  );
  const summerVisit = await visit(berlin, utcOf(summer.year, summer.month, summer.day, 6, 2), 2, [
    darioId,
  ]);
  const cancelled = await visit(
    berlin,
    utcOf(winter.year, winter.month, winter.day, 10, 1),
    1,
    [darioId],
    {
      state: 'cancelled',
    },
  );
  // India keeps +05:30 all year (IST, common knowledge)
  const kolkataVisit = await visit(
    kolkata,
    new Date(Date.UTC(winter.year, winter.month - 1, winter.day + 1, 3, 30)),
    3,
    [darioId],
  );
  const othersVisit = await visit(berlin, utcOf(summer.year, summer.month, summer.day, 11, 2), 1, [
    luciaId,
  ]);
  fx = {
    berlin,
    kolkata,
    winterVisitId: winterVisit.id,
    summerVisitId: summerVisit.id,
    cancelledVisitId: cancelled.id,
    kolkataVisitId: kolkataVisit.id,
    othersVisitId: othersVisit.id,
  };
});

/** Parses a feed as a calendar app would: its own VTIMEZONEs registered, then its events. */
function parseFeed(text: string) {
  const calendar = new ICAL.Component(ICAL.parse(text));
  ICAL.TimezoneService.reset();
  for (const zone of calendar.getAllSubcomponents('vtimezone')) ICAL.TimezoneService.register(zone);
  const events = calendar.getAllSubcomponents('vevent').map((vevent) => {
    const event = new ICAL.Event(vevent);
    return {
      uid: event.uid,
      summary: event.summary,
      location: event.location,
      description: event.description,
      status: vevent.getFirstPropertyValue('status') as string | null,
      tzid: vevent.getFirstProperty('dtstart')?.getParameter('tzid') as string | undefined,
      startLocal: event.startDate.toString(),
      startAt: event.startDate.toJSDate().toISOString(),
      endAt: event.endDate.toJSDate().toISOString(),
    };
  });
  return { calendar, events };
}

const eventOf = (events: ReturnType<typeof parseFeed>['events'], visitId: string) => {
  const found = events.find((e) => e.uid === `visit-${visitId}@ebbline`);
  if (!found) throw new Error(`no event for visit ${visitId}`);
  return found;
};

describe('POST /api/me/calendar-feed', () => {
  it('when a person makes an address, then it is shown once, only its fingerprint is kept, and the sign-in log records it', async () => {
    const res = await post(lucia);
    expect(res.status).toBe(201);
    expect(res.body.url).toMatch(/^http:\/\/[^/]+\/feeds\/visits\/ebc_[\w-]{40,}\.ics$/);
    expect(res.body.webcalUrl).toBe(res.body.url.replace(/^http:/, 'webcal:'));
    expect(res.body.lastUsedAt).toBeNull();
    const secret = /\/(ebc_[\w-]+)\.ics$/.exec(res.body.url)![1]!;

    const stored = await CalendarFeed.findAll({ where: { userId: luciaId } });
    expect(stored).toHaveLength(1);
    expect(stored[0]!.tokenHash).toBe(calendarFeedHash(secret));
    expect(JSON.stringify(stored[0]!.toJSON())).not.toContain(secret);

    const state = await request(app).get('/api/me/calendar-feed').set('Cookie', lucia.cookie);
    expect(state.status).toBe(200);
    expect(state.body).toEqual({ feed: { createdAt: res.body.createdAt, lastUsedAt: null } });
    expect(JSON.stringify(state.body)).not.toContain(secret);

    const [events] = (await sequelize.query(
      `SELECT kind, detail FROM access_events WHERE user_id = :id AND kind LIKE 'calendar-feed-%'`,
      { replacements: { id: luciaId } },
    )) as [Array<{ kind: string; detail: { feedId: string } }>, unknown];
    expect(events).toEqual([
      { kind: 'calendar-feed-created', detail: expect.objectContaining({ feedId: stored[0]!.id }) },
    ]);
  });

  it('when a person makes a new address, then the old one stops working (404) and the new one works', async () => {
    const first = await post(dario);
    const second = await post(dario);
    expect(second.status).toBe(201);
    expect(second.body.url).not.toBe(first.body.url);
    expect((await fetchFeed(first.body.url)).status).toBe(404);
    expect((await fetchFeed(second.body.url)).status).toBe(200);
    expect(await CalendarFeed.count({ where: { userId: darioId, revokedAt: null } })).toBe(1);
  });

  it('when the caller is an API token, not a browser session, then no address is made', async () => {
    const caller = await createCaller(['technician']);
    const res = await request(app)
      .post('/api/me/calendar-feed')
      .set('Authorization', caller.auth)
      .send({});
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('session-required');
    expect(await CalendarFeed.count({ where: { userId: caller.user.id } })).toBe(0);
  });

  it('when nobody is signed in, then 401', async () => {
    expect((await request(app).get('/api/me/calendar-feed')).status).toBe(401);
  });
});

describe('GET /feeds/visits/:secret.ics', () => {
  let feedUrl: string;
  let text: string;
  let events: ReturnType<typeof parseFeed>['events'];

  beforeAll(async () => {
    feedUrl = (await post(dario)).body.url;
    const res = await fetchFeed(feedUrl);
    expect(res.status).toBe(200);
    text = res.text;
    events = parseFeed(text).events;
  });

  it('when fetched, then it is an iCalendar file that is never cached', async () => {
    const res = await fetchFeed(feedUrl);
    expect(res.headers['content-type']).toMatch(/^text\/calendar; charset=utf-8/);
    expect(res.headers['cache-control']).toBe('no-store');
    expect(res.text.startsWith('BEGIN:VCALENDAR\r\n')).toBe(true);
  });

  it('when fetched, then it holds exactly the person’s visits, one event each, and no one else’s', () => {
    const uids = events.map((e) => e.uid).sort();
    expect(uids).toEqual(
      [fx.winterVisitId, fx.summerVisitId, fx.cancelledVisitId, fx.kolkataVisitId]
        .map((id) => `visit-${id}@ebbline`)
        .sort(),
    );
    expect(uids).not.toContain(`visit-${fx.othersVisitId}@ebbline`);
  });

  it('when a winter visit at 06:00 Berlin is read, then DTSTART carries TZID=Europe/Berlin and means 05:00 UTC (CET)', () => {
    const event = eventOf(events, fx.winterVisitId);
    expect(event.tzid).toBe('Europe/Berlin');
    expect(event.startLocal).toMatch(/T06:00:00$/);
    expect(event.startAt).toBe(utcOf(winter.year, winter.month, winter.day, 6, 1).toISOString());
    expect(event.endAt).toBe(utcOf(winter.year, winter.month, winter.day, 8, 1).toISOString());
    expect(text).toMatch(new RegExp(`DTSTART;TZID=Europe/Berlin:${winter.year}0115T060000\\r\\n`));
  });

  it('when a summer visit at 06:00 Berlin is read, then it means 04:00 UTC (CEST): the feed’s VTIMEZONE carries the summer offset', () => {
    const event = eventOf(events, fx.summerVisitId);
    expect(event.tzid).toBe('Europe/Berlin');
    expect(event.startLocal).toMatch(/T06:00:00$/);
    expect(event.startAt).toBe(utcOf(summer.year, summer.month, summer.day, 6, 2).toISOString());
  });

  it('when a visit at a site in another zone is read, then its event is in that zone (Asia/Kolkata, +05:30) with a VTIMEZONE of its own', () => {
    const event = eventOf(events, fx.kolkataVisitId);
    expect(event.tzid).toBe('Asia/Kolkata');
    expect(event.startLocal).toMatch(/T09:00:00$/);
    expect(event.startAt).toBe(
      new Date(Date.UTC(winter.year, winter.month - 1, winter.day + 1, 3, 30)).toISOString(),
    );
    const zones = parseFeed(text)
      .calendar.getAllSubcomponents('vtimezone')
      .map((z) => z.getFirstPropertyValue('tzid'));
    expect(zones.sort()).toEqual(['Asia/Kolkata', 'Europe/Berlin']);
  });

  it('when an event is read, then its summary names the cabinet and its location the site and area', () => {
    const event = eventOf(events, fx.winterVisitId);
    expect(event.summary).toBe(`Decay run: ${fx.berlin.cabinet.tag}`);
    expect(event.location).toContain(fx.berlin.site.name);
    expect(event.location).toContain(fx.berlin.area.name);
  });

  it('when an event’s description is read, then it has the cabinet, the banks, the window, the notes and the whole discharge caution', () => {
    const description = eventOf(events, fx.winterVisitId).description;
    expect(description).toContain(`Cabinet: ${fx.berlin.cabinet.tag}`);
    expect(description).toContain('Banks: DC1 (design');
    expect(description).toContain('DC2 (design');
    expect(description).toContain(
      `Shutdown window: Winter line stop, ${new Date(Date.UTC(winter.year, 0, 15)).toUTCString().slice(0, 3)} 15 Jan ${winter.year}, 05:00–15:00 Europe/Berlin`,
    );
    expect(description).toContain('Notes: Bring the 1000 V probe set');
    expect(description).toContain(DISCHARGE_CAUTION.title);
    for (const line of DISCHARGE_CAUTION.lines) expect(description).toContain(line);
    expect(description).toContain(`/my-visits/${fx.winterVisitId}`);
  });

  it('when a visit falls on an occurrence of a weekly window, then the description names that window and that day’s occurrence', () => {
    const description = eventOf(events, fx.summerVisitId).description;
    expect(description).toMatch(
      /Shutdown window: Summer weekly stop, \w{3} 15 Jul \d{4}, 05:00–15:00 Europe\/Berlin/,
    );
  });

  it('when a visit is outside every window of its area, then the description says so plainly', () => {
    expect(eventOf(events, fx.kolkataVisitId).description).toContain(
      'none of the area’s windows covers this visit',
    );
  });

  it('when a visit is cancelled, then its event is marked cancelled (STATUS:CANCELLED) and says so in its summary', () => {
    const event = eventOf(events, fx.cancelledVisitId);
    expect(event.status).toBe('CANCELLED');
    expect(event.summary).toBe(`Cancelled: Decay run: ${fx.berlin.cabinet.tag}`);
    expect(eventOf(events, fx.winterVisitId).status).toBe('CONFIRMED');
  });

  it('when fetched, then the feed’s last use is noted for its owner to see', async () => {
    const state = await request(app).get('/api/me/calendar-feed').set('Cookie', dario.cookie);
    expect(state.body.feed.lastUsedAt).not.toBeNull();
  });

  it('when the address is turned off, then it answers 404 exactly as an unknown address does, and the log records it', async () => {
    const unknown = await request(app).get(
      '/feeds/visits/ebc_notAnAddressAnybodyWasGivenAtAll0123456789.ics',
    );
    const res = await remove(dario);
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ feed: null });
    const revoked = await fetchFeed(feedUrl);
    expect(revoked.status).toBe(404);
    expect(unknown.status).toBe(404);
    expect(revoked.text).toBe(unknown.text);
    expect(revoked.headers['content-type']).toBe(unknown.headers['content-type']);
    expect(revoked.headers['cache-control']).toBe('no-store');
    const state = await request(app).get('/api/me/calendar-feed').set('Cookie', dario.cookie);
    expect(state.body).toEqual({ feed: null });
    const [rows] = (await sequelize.query(
      `SELECT count(*)::int AS n FROM access_events WHERE user_id = :id AND kind = 'calendar-feed-revoked'`,
      { replacements: { id: darioId } },
    )) as [Array<{ n: number }>, unknown];
    expect(rows[0]!.n).toBeGreaterThanOrEqual(1);
  });

  it('when its owner is deactivated, then the address answers 404', async () => {
    const url = (await post(lucia)).body.url;
    expect((await fetchFeed(url)).status).toBe(200);
    await User.update({ active: false }, { where: { id: luciaId } });
    try {
      expect((await fetchFeed(url)).status).toBe(404);
    } finally {
      await User.update({ active: true }, { where: { id: luciaId } });
    }
  });

  it('when the address is malformed (no .ics, odd characters), then 404', async () => {
    for (const path of [
      '/feeds/visits/ebc_abc',
      '/feeds/visits/%27%3B--.ics',
      '/feeds/visits/.ics',
    ]) {
      expect((await request(app).get(path)).status).toBe(404);
    }
  });
});

describe('the request log', () => {
  it('when a feed is fetched, then the log line has the path without the secret', () => {
    const logged = withoutFeedSecret({
      url: '/feeds/visits/ebc_secretSecret.ics',
      params: { file: 'ebc_secretSecret.ics' },
    });
    expect(JSON.stringify(logged)).not.toContain('secretSecret');
    expect(logged.url).toBe('/feeds/visits/…');
    expect(withoutFeedSecret({ url: '/api/sites' })).toEqual({ url: '/api/sites' });
  });
});
