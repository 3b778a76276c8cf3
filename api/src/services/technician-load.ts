/**
 * The technicians' load for one week: hours of their visits (planned, under way, logged or
 * reviewed) inside the week, against the hours a week each is available (users.
 * available_hours_per_week). Reads only.
 */
import { QueryTypes } from 'sequelize';
import { VISIT_TECHNICIAN_ROLE } from '../../../shared/constants/planning';
import { hoursWithin, plannedHoursWithin, weekOf } from '../../../shared/domain/technician-load';
import type { VisitState } from '../../../shared/domain/visit-states';
import type {
  TechnicianLoadList,
  TechnicianLoadQuery,
  TechnicianLoadVisit,
} from '../../../shared/schemas/technician-load';
import { sequelize } from '../db/sequelize';
import { AppError } from '../errors';

/** Visit states that take a technician's time; missed and cancelled visits took none. */
const LOADING_STATES: VisitState[] = ['planned', 'under-way', 'logged', 'reviewed'];

interface TechnicianRow {
  id: string;
  name: string;
  available_hours_per_week: string | number;
  at_site: boolean;
}

interface LoadVisitRow {
  id: string;
  cabinet_id: string;
  cabinet_tag: string;
  site_name: string;
  area_name: string;
  time_zone: string;
  planned_start_at: Date;
  planned_end_at: Date;
  state: VisitState;
  version: number;
  technician_ids: string[];
}

const byText = (a: string, b: string) =>
  a.localeCompare(b, 'en', { numeric: true, sensitivity: 'base' });

/**
 * Each technician's week: hours planned and available, and the visits behind them, by name.
 * With `siteId`, the technicians attached to that site (every technician when nobody is) and
 * the week on the site's clock; otherwise the week in `timeZone` (UTC by default).
 *
 * @throws AppError `validation-failed` naming `siteId` when the site does not exist
 */
export async function listTechnicianLoad(query: TechnicianLoadQuery): Promise<TechnicianLoadList> {
  let timeZone = query.timeZone ?? 'UTC';
  if (query.siteId) {
    const [site] = await sequelize.query<{ time_zone: string }>(
      'SELECT time_zone FROM sites WHERE id = :id',
      {
        replacements: { id: query.siteId },
        type: QueryTypes.SELECT,
      },
    );
    if (!site)
      throw AppError.badRequest('siteId: This site does not exist.', [
        { path: 'siteId', message: 'This site does not exist.' },
      ]);
    timeZone = site.time_zone;
  }
  const week = weekOf(query.weekOn, timeZone);

  const everyone = await sequelize.query<TechnicianRow>(
    `SELECT u.id, u.name, u.available_hours_per_week,
            EXISTS (SELECT 1 FROM person_sites ps WHERE ps.user_id = u.id AND ps.site_id = CAST(:siteId AS uuid)) AS at_site
       FROM users u WHERE u.active AND :role = ANY(u.roles)`,
    {
      replacements: { siteId: query.siteId ?? null, role: VISIT_TECHNICIAN_ROLE },
      type: QueryTypes.SELECT,
    },
  );
  const atSite = everyone.filter((t) => t.at_site);
  const technicians = (query.siteId && atSite.length > 0 ? atSite : everyone).sort(
    (a, b) => byText(a.name, b.name) || byText(a.id, b.id),
  );
  if (technicians.length === 0)
    return {
      items: [],
      total: 0,
      weekStartOn: week.weekStartOn,
      weekStartsAt: week.startsAt,
      weekEndsAt: week.endsAt,
      timeZone,
    };

  const visits = await sequelize.query<LoadVisitRow>(
    `SELECT v.id, v.cabinet_id, c.tag AS cabinet_tag, s.name AS site_name, a.name AS area_name, s.time_zone,
            v.planned_start_at, v.planned_end_at, v.state, v.version,
            (SELECT array_agg(vt2.user_id::text ORDER BY vt2.user_id) FROM visit_technicians vt2 WHERE vt2.visit_id = v.id) AS technician_ids
       FROM visits v
       JOIN cabinets c ON c.id = v.cabinet_id JOIN areas a ON a.id = c.area_id JOIN sites s ON s.id = a.site_id
      WHERE v.state IN (:states) AND v.planned_start_at < :endsAt AND v.planned_end_at > :startsAt
        AND EXISTS (SELECT 1 FROM visit_technicians vt WHERE vt.visit_id = v.id AND vt.user_id IN (:userIds))
      ORDER BY v.planned_start_at, c.tag, v.id`,
    {
      replacements: {
        states: LOADING_STATES,
        startsAt: week.startsAt,
        endsAt: week.endsAt,
        userIds: technicians.map((t) => t.id),
      },
      type: QueryTypes.SELECT,
    },
  );
  const presented: TechnicianLoadVisit[] = visits.map((v) => {
    const plannedStartAt = v.planned_start_at.toISOString();
    const plannedEndAt = v.planned_end_at.toISOString();
    return {
      id: v.id,
      cabinetId: v.cabinet_id,
      cabinetTag: v.cabinet_tag,
      siteName: v.site_name,
      areaName: v.area_name,
      timeZone: v.time_zone,
      plannedStartAt,
      plannedEndAt,
      state: v.state,
      version: v.version,
      technicianIds: v.technician_ids ?? [],
      hoursInWeek:
        Math.round(hoursWithin(plannedStartAt, plannedEndAt, week.startsAt, week.endsAt) * 100) /
        100,
    };
  });

  const items = technicians.map((t) => {
    const own = presented.filter((v) => v.technicianIds.includes(t.id));
    return {
      technicianId: t.id,
      name: t.name,
      availableHours: Number(t.available_hours_per_week),
      plannedHours: plannedHoursWithin(own, week),
      visits: own,
    };
  });
  return {
    items,
    total: items.length,
    weekStartOn: week.weekStartOn,
    weekStartsAt: week.startsAt,
    weekEndsAt: week.endsAt,
    timeZone,
  };
}
