/**
 * What the shutdown window form sends: its fields (times as the site's wall time) checked and
 * turned into the API's body (UTC instants, the RRULE in its stored form), or the problems
 * by field in the words the form shows.
 */
import { recurrenceFromChoice, type RecurrenceChoice } from '../../../../../shared/domain/recurrence-choices';
import { instantOfLocalWallTime, normalizeRecurrence, windowTimesProblems } from '../../../../../shared/domain/shutdown-windows';

/** The form's fields as typed. */
export interface WindowFormValues {
  areaId: string;
  title: string;
  /** First start, the site's wall time "YYYY-MM-DDTHH:mm". */
  start: string;
  end: string;
  choice: RecurrenceChoice;
  notes: string;
}

export type WindowFormField = 'areaId' | 'title' | 'start' | 'end' | 'recurrence' | 'notes' | 'form';
export type WindowFormProblems = Partial<Record<WindowFormField, string>>;

/** The body of POST /api/shutdown-windows (a PATCH adds the version). */
export interface WindowBody {
  areaId: string;
  title: string;
  startsAt: string;
  endsAt: string;
  recurrence: string | null;
  notes: string;
}

/** The API's field names as the form's. */
export const FORM_FIELD_OF_PATH: Record<string, WindowFormField> = {
  areaId: 'areaId',
  title: 'title',
  startsAt: 'start',
  endsAt: 'end',
  recurrence: 'recurrence',
  notes: 'notes',
};

/**
 * Checks the form in the site's zone and builds the body.
 *
 * @example
 * windowBodyOf({ areaId: 'a', title: 'Weekend stop', start: '2027-01-09T06:00', end: '2027-01-09T14:00', choice, notes: '' }, 'Europe/Berlin')
 * // { body: { …, startsAt: '2027-01-09T05:00:00.000Z', endsAt: '2027-01-09T13:00:00.000Z', recurrence: 'FREQ=WEEKLY;BYDAY=SA;COUNT=8' } }
 */
export function windowBodyOf(values: WindowFormValues, timeZone: string): { body: WindowBody } | { problems: WindowFormProblems } {
  const problems: WindowFormProblems = {};
  if (!values.areaId) problems.areaId = 'Choose the area whose drives are shut down.';
  if (!values.title.trim()) problems.title = 'Enter the title, e.g. Weekend stop.';
  const startsAt = timeZone && values.start ? instantOfLocalWallTime(values.start, timeZone) : null;
  const endsAt = timeZone && values.end ? instantOfLocalWallTime(values.end, timeZone) : null;
  if (!startsAt) problems.start = 'Enter the start as a date and time.';
  if (!endsAt) problems.end = 'Enter the end as a date and time.';
  else if (startsAt && Date.parse(endsAt) <= Date.parse(startsAt)) problems.end = 'The end must be after the start.';
  const rule = normalizeRecurrence(values.start ? recurrenceFromChoice(values.choice, values.start) : null);
  if (!rule.ok) problems.recurrence = rule.message;
  else if (startsAt && endsAt && !problems.end) {
    const found = windowTimesProblems({ startsAt, endsAt, recurrence: rule.recurrence }, timeZone);
    if (found[0]) problems[FORM_FIELD_OF_PATH[found[0].path] ?? 'recurrence'] = found[0].message;
  }
  if (Object.keys(problems).length > 0 || !startsAt || !endsAt || !rule.ok) return { problems };
  return {
    body: { areaId: values.areaId, title: values.title.trim(), startsAt, endsAt, recurrence: rule.recurrence, notes: values.notes.trim() },
  };
}
