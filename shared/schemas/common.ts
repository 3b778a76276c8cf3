/**
 * Building blocks shared by the register's schemas: the concurrency version, calendar dates,
 * optional quantities, and the paginated list query (`?page&pageSize&sort&q&…filters`).
 */
import { z } from 'zod';

/** The version a client last read; a write with an older one is refused (409). */
export const versionField = z
  .number({ error: 'Send the version of the record you edited (a whole number).' })
  .int()
  .min(0);

/**
 * Text PostgreSQL cannot store: a NUL character (text columns refuse it) or half of a UTF-16
 * surrogate pair (not a character at all; JSON's `\ud800` escape decodes to one).
 */
// eslint-disable-next-line no-control-regex -- finding NUL is the point
const UNSTORABLE = /\u0000|[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/;

/** True when PostgreSQL can store `text` as it is. */
export function isStorableText(text: string): boolean {
  return !UNSTORABLE.test(text);
}

/**
 * A string that PostgreSQL can store; every text field of the schemas starts from it.
 * @example storableString('notes').safeParse('a\u0000b').success // false
 */
export const storableString = (what: string, error = `Enter the ${what} as text.`) =>
  z.string({ error }).refine(isStorableText, `The ${what} holds a character that cannot be stored (a NUL or a broken character); retype it.`);

/** The years a register date may fall in: older or later dates are typing slips. */
export const DATE_YEARS = { min: 1900, max: 2200 } as const;

/**
 * A calendar date `YYYY-MM-DD` (no time, no zone) in the years 1900–2200.
 * @example calendarDate('install date').safeParse('0000-01-01').success // false
 */
export const calendarDate = (what = 'date') =>
  z.iso
    .date({ error: `Enter the ${what} as a date (YYYY-MM-DD).` })
    .refine(isInDateYears, `The ${what} must fall between ${DATE_YEARS.min} and ${DATE_YEARS.max}.`);

/** True when the `YYYY-MM-DD` date falls in the years a register date may have. */
export function isInDateYears(date: string): boolean {
  const year = Number(date.slice(0, 4));
  return year >= DATE_YEARS.min && year <= DATE_YEARS.max;
}

/** A field as a change takes it: optional, with no default. */
export type ChangeField<T> = z.ZodOptional<T extends z.ZodDefault<infer Inner> ? Inner : T extends z.ZodType ? T : never>;

/**
 * The shape of a change (a PATCH body): every field optional, and none filled in when left
 * out, so a change writes only the fields it names. zod's `.partial()` keeps `.default()`s: an
 * update schema built from a create schema with it would overwrite every field the change
 * does not name with its default.
 *
 * @example z.object(changeShape({ notes: optionalText(10) })).parse({}) // {} (not { notes: '' })
 */
export function changeShape<S extends z.ZodRawShape>(shape: S): { [K in keyof S]: ChangeField<S[K]> } {
  const out: Record<string, z.ZodType> = {};
  for (const [key, field] of Object.entries(shape)) {
    const inner = field instanceof z.ZodDefault ? (field.unwrap() as z.ZodType) : (field as z.ZodType);
    out[key] = inner.optional();
  }
  return out as { [K in keyof S]: ChangeField<S[K]> };
}

/**
 * Sent as true to save a value the register finds unlikely (a `confirmation-needed` answer
 * asked "are you sure?"); values that cannot be true are refused whatever it says.
 */
export const confirmationField = z.boolean({ error: 'confirmed is true or false.' }).optional();

/** A calendar date that may be left empty (null). */
export const optionalCalendarDate = (what = 'date') => calendarDate(what).nullable().default(null);

/** Free text that may be empty; trimmed. */
export const optionalText = (max: number, what = 'text') =>
  storableString(what).trim().max(max, `Keep the ${what} under ${max} characters.`).default('');

/** A required short text; trimmed. */
export const requiredText = (max: number, what: string) =>
  storableString(what, `Enter the ${what}.`)
    .trim()
    .min(1, `Enter the ${what}.`)
    .max(max, `Keep the ${what} under ${max} characters.`);

/** A positive quantity (e.g. volts, ohms); `what` names it in the message. */
export const positiveNumber = (what: string) =>
  z
    .number({ error: `Enter the ${what} as a number.` })
    .positive(`The ${what} must be greater than zero.`);

/** A whole number within bounds. */
export const wholeNumber = (what: string, min: number, max: number) =>
  z
    .number({ error: `Enter the ${what} as a whole number.` })
    .int(`Enter the ${what} as a whole number.`)
    .min(min, `The ${what} must be at least ${min}.`)
    .max(max, `The ${what} must be at most ${max}.`);

/** A record id (UUID). */
export const recordId = (what: string) => z.uuid({ error: `Choose the ${what}.` });

/** `true`/`false` as a query string writes them. */
export const queryFlag = z
  .enum(['true', 'false', '1', '0'])
  .transform((v) => v === 'true' || v === '1');

/** Page sizes offered by the lists; the API accepts any size from 1 to 100. */
export const PAGE_SIZES = [10, 25, 50, 100] as const;

/**
 * The query of a paginated list. `sort` names a field, with a leading `-` for descending
 * (`sort=-tag`); `q` searches; `extra` adds the resource's filters.
 */
export function listQuerySchema<const F extends readonly [string, ...string[]], E extends z.ZodRawShape>(
  sortFields: F,
  defaultSort: F[number] | `-${F[number]}`,
  extra: E,
) {
  const sortValues = [...sortFields, ...sortFields.map((f) => `-${f}`)] as [string, ...string[]];
  return z.object({
    page: z.coerce.number().int().min(1, 'page starts at 1').default(1),
    pageSize: z.coerce.number().int().min(1).max(100, 'pageSize is at most 100').default(25),
    sort: z
      .enum(sortValues, { error: `sort must be one of: ${sortValues.join(', ')}` })
      .default(defaultSort)
      .transform((s) => parseSort<F[number]>(s)),
    q: storableString('search').trim().max(100).optional(),
    includeRetired: queryFlag.default(false),
    ...extra,
  });
}

/** A sort order: field and direction. */
export interface SortOrder<F extends string = string> {
  field: F;
  direction: 'asc' | 'desc';
}

function parseSort<F extends string>(value: string): SortOrder<F> {
  return value.startsWith('-')
    ? { field: value.slice(1) as F, direction: 'desc' }
    : { field: value as F, direction: 'asc' };
}

/** One page of a list and the count of all matching records. */
export interface ListPage<T> {
  items: T[];
  total: number;
  page: number;
  pageSize: number;
}

/** Who did something, as shown beside a record. */
export interface PersonRef {
  id: string;
  name: string;
}

/** Fields every register record carries in the API's answers. */
export interface RecordMeta {
  id: string;
  version: number;
  /** When the record was retired (soft-deleted), UTC ISO; null while in use. */
  retiredAt: string | null;
  createdAt: string;
  updatedAt: string;
}
