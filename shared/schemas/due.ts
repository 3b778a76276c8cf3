/**
 * The Due list: every bank in service with the day it is due for inspection (the rule of
 * shared/domain/due.ts), its bucket (overdue, due this month, due in the next three months,
 * later) on its site's local day, its health, and whether a visit already covers it.
 * Filtered, sorted and paged on the server.
 */
import { z } from 'zod';
import { HEALTH_NAMES, type HealthName } from '../constants/health';
import { CRITICALITIES, type Criticality } from '../constants/register';
import type { Role } from '../constants/roles';
import { DUE_BUCKETS, type DueBasis, type DueBucket, type DueStartKind } from '../domain/due';
import { calendarDate, listQuerySchema, queryFlag, type ListPage } from './common';

/** Who reads the Due list: planners, admins and reliability engineers; technicians for their sites. */
export const DUE_READERS: readonly Role[] = ['admin', 'planner', 'reliability', 'technician'];

/** Roles that read the whole fleet's Due list (a technician holding none of them sees only their sites). */
export const DUE_FLEET_READERS: readonly Role[] = ['admin', 'planner', 'reliability'];

/** A bank's health in the Due list: the latest verdict's, or `unmeasured` when it has none. */
export const DUE_HEALTHS = [...HEALTH_NAMES, 'unmeasured'] as const;
export type DueHealth = HealthName | 'unmeasured';

/** How each Due health is written on screen. */
export const DUE_HEALTH_LABELS: Record<DueHealth, string> = {
  healthy: 'healthy',
  watch: 'watch',
  'end-of-life': 'end of life',
  unmeasured: 'not measured yet',
};

export const DUE_SORT_FIELDS = [
  'dueOn',
  'cabinet',
  'site',
  'area',
  'design',
  'criticality',
  'lastInspectedOn',
] as const;
export type DueSortField = (typeof DUE_SORT_FIELDS)[number];

/**
 * `GET /api/due` query: `bucket` (overdue, this-month, next-quarter, later; none = all),
 * `siteId`, `areaId`, `cabinetId`, `bankDesignId`, `criticality`, `health`, `dueBy` (due on or
 * before a date), `planned` (true: a planned or under-way visit covers it; false: none does),
 * `q` (cabinet tag, bank position or design code), `sort` (default `dueOn`), `page`, `pageSize`.
 */
export const dueListQuerySchema = listQuerySchema(DUE_SORT_FIELDS, 'dueOn', {
  bucket: z
    .enum(DUE_BUCKETS, { error: `bucket must be one of: ${DUE_BUCKETS.join(', ')}` })
    .optional(),
  siteId: z.uuid({ error: 'siteId must be a site id.' }).optional(),
  areaId: z.uuid({ error: 'areaId must be an area id.' }).optional(),
  cabinetId: z.uuid({ error: 'cabinetId must be a cabinet id.' }).optional(),
  bankDesignId: z.uuid({ error: 'bankDesignId must be a bank design id.' }).optional(),
  criticality: z
    .enum(CRITICALITIES, { error: `criticality must be one of: ${CRITICALITIES.join(', ')}` })
    .optional(),
  health: z
    .enum(DUE_HEALTHS, { error: `health must be one of: ${DUE_HEALTHS.join(', ')}` })
    .optional(),
  dueBy: calendarDate('due-by date').optional(),
  planned: queryFlag.optional(),
});
export type DueListQuery = z.output<typeof dueListQuerySchema>;
export type DueListQueryInput = z.input<typeof dueListQuerySchema>;

/** A visit covering a bank, as the Due list names it. */
export interface DueVisitRef {
  id: string;
  plannedStartAt: string;
  plannedEndAt: string;
}

/** One bank of the Due list. Dates `...On` are `YYYY-MM-DD` in the site's time zone. */
export interface DueBank {
  bankId: string;
  position: string;
  bankDesignId: string;
  bankDesignCode: string;
  cabinetId: string;
  cabinetTag: string;
  criticality: Criticality;
  siteId: string;
  siteName: string;
  timeZone: string;
  areaId: string;
  areaName: string;
  /** The design's inspection interval, in days. */
  inspectionIntervalDays: number;
  /** Local date of the latest logged or reviewed visit covering the bank; null when none. */
  lastInspectedOn: string | null;
  installedOn: string | null;
  baselineSetOn: string;
  /** The date the interval counts from, and what it is. */
  startOn: string;
  startKind: DueStartKind;
  /** The forecast's latest next visit, when a forecast is known. */
  forecastNextVisitOn: string | null;
  dueOn: string;
  /** Which term of the rule gave `dueOn`. */
  basis: DueBasis;
  bucket: DueBucket;
  /** The site's local day the bucket was judged on. */
  todayOn: string;
  /** Days from `todayOn` to `dueOn`; negative when overdue. */
  daysUntilDue: number;
  health: DueHealth;
  /** The earliest planned or under-way visit covering the bank; null when none. */
  plannedVisit: DueVisitRef | null;
  /** The bank's last visit when it was missed (its latest visit that is not still to come or cancelled). */
  missedVisit: (DueVisitRef & { missedAt: string | null }) | null;
}

/** Banks per bucket for the same filters (all buckets, whatever `bucket` asks). */
export type DueBucketCounts = Record<DueBucket, number>;

/** `GET /api/due` answer. */
export interface DueList extends ListPage<DueBank> {
  counts: DueBucketCounts;
  /** The instant the list was judged at, UTC ISO. */
  asOf: string;
}
