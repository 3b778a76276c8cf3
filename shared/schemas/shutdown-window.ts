/**
 * A shutdown window: when an area's drives are de-energised, so decay runs can be made. Its
 * first occurrence (`startsAt`, `endsAt`) and, when it repeats, an RRULE body expanded in the
 * site's time zone (shared/domain/shutdown-windows.ts).
 */
import { z } from 'zod';
import { normalizeRecurrence } from '../domain/shutdown-windows';
import { changeShape, DATE_YEARS, optionalText, queryFlag, recordId, requiredText, storableString, versionField } from './common';

/**
 * An instant: ISO 8601 with `Z` or an offset (`2027-01-09T06:00:00+01:00`), in the years the
 * register allows; given back as UTC ISO (`2027-01-09T05:00:00.000Z`).
 */
export const instantField = (what: string) =>
  z.iso
    .datetime({ offset: true, error: `Enter the ${what} as a date and time with its offset, e.g. 2027-01-09T06:00:00+01:00.` })
    .transform((text) => new Date(text).toISOString())
    .refine((iso) => {
      const year = Number(iso.slice(0, 4));
      return year >= DATE_YEARS.min && year <= DATE_YEARS.max;
    }, `The ${what} must fall between ${DATE_YEARS.min} and ${DATE_YEARS.max}.`);

/**
 * A recurrence as typed: an RRULE body (`FREQ=WEEKLY;BYDAY=SA;COUNT=8`), stored in its
 * normal form; empty or null for a one-off.
 */
export const recurrenceField = storableString('recurrence')
  .max(500, 'Keep the recurrence under 500 characters.')
  .nullable()
  .transform((text, ctx) => {
    const check = normalizeRecurrence(text);
    if (!check.ok) {
      ctx.addIssue({ code: 'custom', message: check.message });
      return z.NEVER;
    }
    return check.recurrence;
  });

/** Fields a person enters for a shutdown window. */
const shutdownWindowFields = {
  areaId: recordId('area'),
  title: requiredText(120, 'title'),
  /** First occurrence's start, UTC ISO. */
  startsAt: instantField('start'),
  /** First occurrence's end, UTC ISO; after the start. */
  endsAt: instantField('end'),
  recurrence: recurrenceField.default(null),
  notes: optionalText(2000, 'notes'),
};

const endAfterStart = (value: { startsAt?: string; endsAt?: string }, ctx: z.RefinementCtx) => {
  if (value.startsAt && value.endsAt && Date.parse(value.endsAt) <= Date.parse(value.startsAt))
    ctx.addIssue({ code: 'custom', path: ['endsAt'], message: 'The end must be after the start.' });
};

export const shutdownWindowInputSchema = z.object(shutdownWindowFields).superRefine(endAfterStart);
export type ShutdownWindowInput = z.input<typeof shutdownWindowInputSchema>;
export type ShutdownWindowData = z.output<typeof shutdownWindowInputSchema>;

/** A change to a window, with the version the editor read; names only what it changes. */
export const shutdownWindowUpdateSchema = z
  .object({ ...changeShape(shutdownWindowFields), version: versionField })
  .superRefine(endAfterStart);
export type ShutdownWindowUpdate = z.output<typeof shutdownWindowUpdateSchema>;

/** The longest range the list expands occurrences over (days). */
export const MAX_WINDOW_RANGE_DAYS = 800;

/**
 * The list: windows of an area or site; with `from` and `to` only those having an occurrence
 * in `[from, to)`, each with its occurrences there.
 */
export const shutdownWindowListQuerySchema = z
  .object({
    areaId: z.uuid({ error: 'areaId is a record id.' }).optional(),
    siteId: z.uuid({ error: 'siteId is a record id.' }).optional(),
    from: instantField('range start').optional(),
    to: instantField('range end').optional(),
    includeRetired: queryFlag.default(false),
    page: z.coerce.number().int().min(1, 'page starts at 1').default(1),
    pageSize: z.coerce.number().int().min(1).max(200, 'pageSize is at most 200').default(100),
  })
  .superRefine((query, ctx) => {
    if ((query.from === undefined) !== (query.to === undefined))
      ctx.addIssue({ code: 'custom', path: [query.from === undefined ? 'from' : 'to'], message: 'Give both from and to, or neither.' });
    if (query.from && query.to) {
      const days = (Date.parse(query.to) - Date.parse(query.from)) / 86_400_000;
      if (days <= 0) ctx.addIssue({ code: 'custom', path: ['to'], message: 'to must be after from.' });
      else if (days > MAX_WINDOW_RANGE_DAYS)
        ctx.addIssue({ code: 'custom', path: ['to'], message: `Ask for at most ${MAX_WINDOW_RANGE_DAYS} days at a time.` });
    }
  });
export type ShutdownWindowListQuery = z.output<typeof shutdownWindowListQuerySchema>;

/** One occurrence of a window, UTC ISO instants. */
export interface ShutdownWindowOccurrence {
  startsAt: string;
  endsAt: string;
}

/** A shutdown window as the API returns it. */
export interface ShutdownWindow {
  id: string;
  areaId: string;
  areaName: string;
  siteId: string;
  siteName: string;
  /** The site's IANA time zone, in which the window repeats and is shown. */
  timeZone: string;
  title: string;
  startsAt: string;
  endsAt: string;
  recurrence: string | null;
  /** The recurrence in words (rrule's), e.g. "every week on Saturday for 8 times"; "once" for a one-off. */
  recurrenceText: string;
  notes: string;
  version: number;
  retiredAt: string | null;
  createdAt: string;
  updatedAt: string;
  /** The occurrences in the asked range (lists with from/to only). */
  occurrences?: ShutdownWindowOccurrence[];
}
