/**
 * The technicians' load for one week: `GET /api/technician-load?weekOn=YYYY-MM-DD`, hours
 * planned against hours available, with the visits behind them.
 */
import { z } from 'zod';
import type { VisitState } from '../domain/visit-states';
import { calendarDate } from './common';

/** An IANA time zone the runtime knows, e.g. 'Europe/Berlin'. */
const timeZoneField = z
  .string({ error: 'timeZone is an IANA time zone, e.g. Europe/Berlin.' })
  .max(64, 'timeZone is an IANA time zone, e.g. Europe/Berlin.')
  .refine((zone) => {
    try {
      new Intl.DateTimeFormat('en', { timeZone: zone });
      return true;
    } catch {
      return false;
    }
  }, 'timeZone is an IANA time zone, e.g. Europe/Berlin.');

/**
 * The query: any day of the week wanted (the week runs Monday 00:00 to the next Monday 00:00);
 * `siteId` keeps the technicians attached to that site and counts the week on its clock;
 * otherwise `timeZone` (default UTC).
 */
export const technicianLoadQuerySchema = z.object({
  weekOn: calendarDate('week'),
  siteId: z.uuid({ error: 'siteId is a site id.' }).optional(),
  timeZone: timeZoneField.optional(),
});
export type TechnicianLoadQuery = z.output<typeof technicianLoadQuerySchema>;

/** A visit in a technician's week. */
export interface TechnicianLoadVisit {
  id: string;
  cabinetId: string;
  cabinetTag: string;
  siteName: string;
  areaName: string;
  /** The site's zone, to show the times in. */
  timeZone: string;
  plannedStartAt: string;
  plannedEndAt: string;
  state: VisitState;
  /** For a reassignment (PATCH /api/visits/:id names the version it read). */
  version: number;
  technicianIds: string[];
  /** Hours of the visit inside the week. */
  hoursInWeek: number;
}

/** One technician's week. */
export interface TechnicianLoad {
  technicianId: string;
  name: string;
  /** Hours a week the technician is available for visits. */
  availableHours: number;
  /** Hours of their visits (planned, under way, logged or reviewed) inside the week, to 0.1 h. */
  plannedHours: number;
  visits: TechnicianLoadVisit[];
}

/** The answer. */
export interface TechnicianLoadList {
  items: TechnicianLoad[];
  total: number;
  /** The Monday of the week, `YYYY-MM-DD`. */
  weekStartOn: string;
  /** The week's bounds, UTC ISO: Monday 00:00 to the next Monday 00:00 in `timeZone`. */
  weekStartsAt: string;
  weekEndsAt: string;
  timeZone: string;
}
