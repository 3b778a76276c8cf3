/**
 * A visit: one or more banks of one cabinet at a planned start and end, assigned to one or more
 * technicians. The schemas validate the API's bodies and queries and drive the Planner's form.
 */
import { z } from 'zod';
import {
  PLANNING_REASON_MIN_CHARS,
  PLANNING_WARNING_KINDS,
  VISIT_BATCH_MAX,
  VISIT_PAGE_SIZE_MAX,
  type PlanningWarningKind,
} from '../constants/planning';
import {
  VISIT_STATES,
  VISIT_TRANSITION_ACTIONS,
  type VisitState,
} from '../domain/visit-states';
import { DATE_YEARS, optionalText, queryFlag, recordId, storableString, versionField } from './common';

/**
 * An instant as ISO 8601 with a zone or offset (`2027-01-09T06:00:00Z`,
 * `2027-01-09T07:00:00+01:00`), in the years a register date may have.
 */
export const instant = (what: string) =>
  z.iso
    .datetime({ offset: true, error: `Enter the ${what} as a date and time with its zone (e.g. 2027-01-09T06:00:00Z).` })
    .refine((value) => {
      const year = new Date(value).getUTCFullYear();
      return year >= DATE_YEARS.min && year <= DATE_YEARS.max;
    }, `The ${what} must fall between ${DATE_YEARS.min} and ${DATE_YEARS.max}.`)
    .transform((value) => new Date(value).toISOString());

/** A reason a person gives (cancel, replan, override): trimmed, at least a few characters. */
export const planningReason = (what = 'reason') =>
  storableString(what, `Give a ${what}.`)
    .trim()
    .min(PLANNING_REASON_MIN_CHARS, `Give a ${what} of at least ${PLANNING_REASON_MIN_CHARS} characters.`)
    .max(500, `Keep the ${what} under 500 characters.`);

/** A planning warning accepted with a reason. */
export const planningOverrideSchema = z.object({
  kind: z.enum(PLANNING_WARNING_KINDS, { error: `Choose one of: ${PLANNING_WARNING_KINDS.join(', ')}.` }),
  reason: planningReason('reason for the override'),
});
export type PlanningOverride = z.output<typeof planningOverrideSchema>;

const overridesField = z
  .array(planningOverrideSchema, { error: 'Send the overrides as a list of { kind, reason }.' })
  .max(PLANNING_WARNING_KINDS.length, 'Override each warning once.')
  .refine((list) => new Set(list.map((o) => o.kind)).size === list.length, 'Override each warning once.');

const idList = (what: string, plural: string) =>
  z
    .array(recordId(what), { error: `Choose at least one ${what}.` })
    .min(1, `Choose at least one ${what}.`)
    .max(100, `Choose at most 100 ${plural}.`)
    .refine((ids) => new Set(ids).size === ids.length, `Choose each ${what} once.`);

/** Fields a planner enters for a visit. */
const visitFields = {
  cabinetId: recordId('cabinet'),
  /** Banks of the cabinet, in service, the visit covers. */
  bankIds: idList('bank', 'banks'),
  plannedStartAt: instant('planned start'),
  plannedEndAt: instant('planned end'),
  /** People holding the technician role. */
  technicianIds: idList('technician', 'technicians'),
  notes: optionalText(2000, 'notes'),
  /** Planning warnings accepted, each with a reason. */
  overrides: overridesField.default([]),
};

/** The end after the start, or an issue on `plannedEndAt`. */
function endAfterStart(value: { plannedStartAt?: string; plannedEndAt?: string }, ctx: z.RefinementCtx) {
  if (value.plannedStartAt !== undefined && value.plannedEndAt !== undefined && value.plannedEndAt <= value.plannedStartAt) {
    ctx.addIssue({ code: 'custom', path: ['plannedEndAt'], message: 'The planned end must come after the planned start.' });
  }
}

/** A new visit. */
export const visitInputSchema = z.object(visitFields).superRefine(endAfterStart);
export type VisitInput = z.input<typeof visitInputSchema>;
export type VisitData = z.output<typeof visitInputSchema>;

/** A planning check (`POST /api/visits/check`): a visit as it would be saved; `visitId` names the visit being replanned. */
export const visitCheckSchema = z
  .object({ ...visitFields, visitId: recordId('visit').optional() })
  .superRefine(endAfterStart);
export type VisitCheckInput = z.output<typeof visitCheckSchema>;

/** Several visits saved together, all or none (a window's plan confirmed in one step). */
export const visitBatchSchema = z.object({
  visits: z
    .array(visitInputSchema, { error: 'Send the visits as a list.' })
    .min(1, 'Send at least one visit.')
    .max(VISIT_BATCH_MAX, `Send at most ${VISIT_BATCH_MAX} visits at once.`),
});
export type VisitBatch = z.output<typeof visitBatchSchema>;

/** Fields that replan a visit: changing any of them needs a reason. */
export const VISIT_REPLAN_FIELDS = ['plannedStartAt', 'plannedEndAt', 'technicianIds', 'bankIds'] as const;

/**
 * A change to a visit (PATCH): only the fields it names change. Moving it, or changing its
 * technicians or banks, is a replan and carries a `reason`.
 */
export const visitUpdateSchema = z
  .object({
    version: versionField,
    reason: planningReason().optional(),
    plannedStartAt: instant('planned start').optional(),
    plannedEndAt: instant('planned end').optional(),
    technicianIds: idList('technician', 'technicians').optional(),
    bankIds: idList('bank', 'banks').optional(),
    notes: storableString('notes').trim().max(2000, 'Keep the notes under 2000 characters.').optional(),
    overrides: overridesField.optional(),
  })
  .superRefine((value, ctx) => {
    endAfterStart(value, ctx);
    if (value.reason === undefined && VISIT_REPLAN_FIELDS.some((field) => value[field] !== undefined)) {
      ctx.addIssue({ code: 'custom', path: ['reason'], message: 'Give a reason for the replan.' });
    }
  });
export type VisitUpdate = z.output<typeof visitUpdateSchema>;

/** A state change a person makes: start, log, review or cancel (cancel with a reason). */
export const visitTransitionSchema = z
  .object({
    action: z.enum(VISIT_TRANSITION_ACTIONS, { error: `Choose one of: ${VISIT_TRANSITION_ACTIONS.join(', ')}.` }),
    version: versionField,
    reason: planningReason().optional(),
  })
  .superRefine((value, ctx) => {
    if (value.action === 'cancel' && value.reason === undefined) {
      ctx.addIssue({ code: 'custom', path: ['reason'], message: 'Give a reason for cancelling.' });
    }
  });
export type VisitTransition = z.output<typeof visitTransitionSchema>;

/** The visit list's sort fields. */
export const VISIT_SORT_FIELDS = ['plannedStartAt'] as const;

/** A comma list of states, e.g. `state=planned,under-way`. */
const stateList = z.string().transform((text, ctx) => {
  const states = text.split(',').map((s) => s.trim()).filter((s) => s !== '');
  const unknown = states.filter((s) => !(VISIT_STATES as readonly string[]).includes(s));
  if (states.length === 0 || unknown.length > 0) {
    ctx.addIssue({ code: 'custom', message: `Each state is one of: ${VISIT_STATES.join(', ')}.` });
    return z.NEVER;
  }
  return states as VisitState[];
});

/**
 * The visit list's query. `from`/`to` keep the visits whose planned times overlap [from, to).
 */
export const visitListQuerySchema = z
  .object({
    from: instant('from').optional(),
    to: instant('to').optional(),
    state: stateList.optional(),
    technicianId: z.uuid({ error: 'technicianId is a person id.' }).optional(),
    siteId: z.uuid({ error: 'siteId is a site id.' }).optional(),
    areaId: z.uuid({ error: 'areaId is an area id.' }).optional(),
    cabinetId: z.uuid({ error: 'cabinetId is a cabinet id.' }).optional(),
    mine: queryFlag.default(false),
    page: z.coerce.number().int().min(1, 'page starts at 1').default(1),
    pageSize: z.coerce
      .number()
      .int()
      .min(1, 'pageSize is at least 1')
      .max(VISIT_PAGE_SIZE_MAX, `pageSize is at most ${VISIT_PAGE_SIZE_MAX}`)
      .default(50),
    sort: z
      .enum(['plannedStartAt', '-plannedStartAt'], { error: 'sort must be plannedStartAt or -plannedStartAt' })
      .default('plannedStartAt'),
  })
  .superRefine((value, ctx) => {
    if (value.from !== undefined && value.to !== undefined && value.to <= value.from) {
      ctx.addIssue({ code: 'custom', path: ['to'], message: 'to must come after from.' });
    }
  });
export type VisitListQuery = z.output<typeof visitListQuerySchema>;

/** A bank a visit covers, as the API returns it. */
export interface VisitBankRef {
  id: string;
  position: string;
  bankDesignCode: string;
  baselineTauSeconds: number;
  /** τ of the bank's newest current accepted decay run (any visit), seconds; null when none. */
  lastTauSeconds: number | null;
  /** The bank's current decay runs on this visit (corrected versions counted once). */
  runCount: number;
}

/** A visit as the API returns it. Instants are UTC ISO; show them in `timeZone` (the site's). */
export interface Visit {
  id: string;
  cabinetId: string;
  cabinetTag: string;
  /** The cabinet's location text, when it has one. */
  cabinetName?: string;
  siteId: string;
  siteName: string;
  /** The site's IANA time zone. */
  timeZone: string;
  areaId: string;
  areaName: string;
  plannedStartAt: string;
  plannedEndAt: string;
  state: VisitState;
  unplanned: boolean;
  notes: string;
  overrides: PlanningOverride[];
  /** The reason of the last cancel or replan. */
  stateReason: string;
  startedAt: string | null;
  loggedAt: string | null;
  reviewedAt: string | null;
  missedAt: string | null;
  cancelledAt: string | null;
  banks: VisitBankRef[];
  technicians: { id: string; name: string }[];
  /** The drive maker's marked wait time before opening, minutes; null when not marked. */
  cabinetMarkedWaitMinutes: number | null;
  /** The visit's estimated duration, minutes (setup, about 5 τ of capture and the marked wait per bank). */
  estimatedMinutes: number;
  version: number;
  createdAt: string;
  updatedAt: string;
}

/** One warning of a planning check. */
export interface PlanningWarning {
  kind: PlanningWarningKind;
  message: string;
  /** The technician double-booked. */
  technicianId?: string;
  /** The bank not yet due. */
  bankId?: string;
}

/** The answer of `POST /api/visits/check`. */
export interface PlanningCheck {
  warnings: PlanningWarning[];
}
