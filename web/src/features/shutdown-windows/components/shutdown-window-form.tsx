import { useState, type FormEvent } from 'react';
import { Link } from 'react-router';
import {
  choiceFromRecurrence,
  NO_REPEAT,
  recurrenceFromChoice,
  repeatLabels,
  type RecurrenceChoice,
  type RepeatEnd,
  type RepeatKind,
} from '../../../../../shared/domain/recurrence-choices';
import {
  instantOfLocalWallTime,
  localWallTimeOf,
  normalizeRecurrence,
  recurrenceText,
  windowOccurrences,
  windowTimesProblems,
} from '../../../../../shared/domain/shutdown-windows';
import type { ShutdownWindow } from '../../../../../shared/schemas/shutdown-window';
import { Button } from '../../../components/ui/button';
import { Field, Select, TextArea, TextInput } from '../../../components/ui/field';
import { Modal } from '../../../components/ui/modal';
import { ApiError } from '../../../lib/api-client';
import { useAreasOfSite, useSitesInUse } from '../api/places';
import { useRetireShutdownWindow, useSaveShutdownWindow } from '../api/shutdown-windows';
import { FORM_FIELD_OF_PATH, windowBodyOf, type WindowFormProblems } from '../utils/window-form';
import { windowTimeText } from '../utils/window-times';

type Problems = WindowFormProblems & { siteId?: string };

const UNIT_OF_KIND: Partial<Record<RepeatKind, [string, string]>> = {
  daily: ['day', 'days'],
  weekly: ['week', 'weeks'],
  'monthly-weekday': ['month', 'months'],
  'monthly-day': ['month', 'months'],
};

/** How many of the coming occurrences the form shows as a check of the rule. */
const SHOWN_OCCURRENCES = 4;

/** A window's times as they would be stored: the first problem, or the first occurrences. */
function ruleCheck(startsAt: string | null, endsAt: string | null, recurrence: string | null | undefined, timeZone: string) {
  if (!startsAt || !endsAt || recurrence === undefined || !timeZone) return null;
  const times = { startsAt, endsAt, recurrence };
  const found = windowTimesProblems(times, timeZone);
  if (found.length > 0) return { problem: found[0]!.message, next: [], more: false };
  const yearsAhead = new Date(Date.parse(startsAt) + 3 * 366 * 86_400_000).toISOString();
  const coming = windowOccurrences(times, timeZone, startsAt, yearsAhead, SHOWN_OCCURRENCES + 1);
  return { problem: null, next: coming.slice(0, SHOWN_OCCURRENCES), more: coming.length > SHOWN_OCCURRENCES };
}

export interface ShutdownWindowFormProps {
  /** The window to change; absent for a new one. */
  window?: ShutdownWindow;
  /** The site and area a new window starts with (e.g. the Planner's filters). */
  siteId?: string;
  areaId?: string;
  /** A new window's first start, as the site's wall time "YYYY-MM-DDTHH:mm". */
  startLocal?: string;
  onSaved: (window: ShutdownWindow) => void;
  onCancel: () => void;
}

/**
 * The shutdown window form: area, title, first start and end on the site's clock (the zone
 * named), how it repeats in plain words (every week on Saturday, the second Saturday of every
 * month, …, ending after N times or on a day) or as an RRULE for those who write one, with the
 * next occurrences shown as a check, and notes.
 */
export function ShutdownWindowForm({ window, siteId: initialSiteId, areaId: initialAreaId, startLocal, onSaved, onCancel }: ShutdownWindowFormProps) {
  const sites = useSitesInUse();
  const [siteId, setSiteId] = useState(window?.siteId ?? initialSiteId ?? '');
  const areas = useAreasOfSite(siteId);
  const [areaId, setAreaId] = useState(window?.areaId ?? initialAreaId ?? '');
  const siteList = (sites.data?.items ?? []).filter((s) => !s.retiredAt);
  const site = siteList.find((s) => s.id === siteId);
  const timeZone = window?.timeZone ?? site?.timeZone ?? '';
  const [title, setTitle] = useState(window?.title ?? '');
  const [start, setStart] = useState(window ? localWallTimeOf(window.startsAt, window.timeZone) : (startLocal ?? ''));
  const [end, setEnd] = useState(window ? localWallTimeOf(window.endsAt, window.timeZone) : '');
  const [choice, setChoice] = useState<RecurrenceChoice>(
    window ? choiceFromRecurrence(window.recurrence, localWallTimeOf(window.startsAt, window.timeZone)) : NO_REPEAT,
  );
  const [notes, setNotes] = useState(window?.notes ?? '');
  const [problems, setProblems] = useState<Problems>({});
  const save = useSaveShutdownWindow(window);
  const retire = useRetireShutdownWindow();

  // a new window's site: the only one there is
  if (!siteId && siteList.length === 1) setSiteId(siteList[0]!.id);

  const startsAt = timeZone && start ? instantOfLocalWallTime(start, timeZone) : null;
  const endsAt = timeZone && end ? instantOfLocalWallTime(end, timeZone) : null;
  const recurrenceTyped = start ? recurrenceFromChoice(choice, start) : null;
  const recurrenceCheck = normalizeRecurrence(recurrenceTyped);
  const labels = repeatLabels(start || '2027-01-09T06:00');

  // the rule as it would be stored, in words, and its first occurrences: what the person checks
  const check = ruleCheck(startsAt, endsAt, recurrenceCheck.ok ? recurrenceCheck.recurrence : undefined, timeZone);

  const submit = (event: FormEvent) => {
    event.preventDefault();
    const checked = windowBodyOf({ areaId, title, start, end, choice, notes }, timeZone);
    if ('problems' in checked) {
      setProblems(checked.problems);
      return;
    }
    setProblems({});
    const body = checked.body;
    save.mutate(window ? { ...body, version: window.version } : body, {
      onSuccess: onSaved,
      onError: (error) => {
        if (error instanceof ApiError && error.issues.length > 0) {
          const fromServer: Problems = {};
          for (const issue of error.issues) fromServer[FORM_FIELD_OF_PATH[issue.path] ?? 'form'] = issue.message;
          setProblems(fromServer);
        } else setProblems({ form: error.message });
      },
    });
  };

  const unit = UNIT_OF_KIND[choice.kind];
  const setChoiceField = (change: Partial<RecurrenceChoice>) => setChoice((c) => ({ ...c, ...change }));
  return (
    <form onSubmit={submit} noValidate className="space-y-4" aria-label={window ? 'Change shutdown window' : 'New shutdown window'}>
      <div className="grid gap-4 sm:grid-cols-2">
        <Field id="window-site" label="Site" required error={problems.siteId}>
          <Select
            id="window-site"
            value={siteId}
            disabled={Boolean(window)}
            onChange={(e) => {
              setSiteId(e.target.value);
              setAreaId('');
            }}
          >
            <option value="">Choose a site</option>
            {siteList.map((s) => (
              <option key={s.id} value={s.id}>
                {s.name}
              </option>
            ))}
          </Select>
        </Field>
        <Field id="window-area" label="Area" required error={problems.areaId} hint="The drives of this area are de-energised.">
          <Select id="window-area" value={areaId} invalid={Boolean(problems.areaId)} onChange={(e) => setAreaId(e.target.value)} disabled={!siteId}>
            <option value="">{siteId ? 'Choose an area' : 'Choose the site first'}</option>
            {(areas.data?.items ?? [])
              .filter((a) => !a.retiredAt)
              .map((a) => (
                <option key={a.id} value={a.id}>
                  {a.name}
                </option>
              ))}
          </Select>
        </Field>
      </div>
      <Field id="window-title" label="Title" required error={problems.title}>
        <TextInput id="window-title" value={title} maxLength={120} invalid={Boolean(problems.title)} onChange={(e) => setTitle(e.target.value)} placeholder="Weekend stop" />
      </Field>
      <div className="grid gap-4 sm:grid-cols-2">
        <Field id="window-start" label="Starts" required error={problems.start} hint={timeZone ? `On the site's clock, ${timeZone}` : 'Choose the site first'}>
          <TextInput
            id="window-start"
            type="datetime-local"
            value={start}
            invalid={Boolean(problems.start)}
            onChange={(e) => {
              const value = e.target.value;
              // a new window keeps its length when the start moves; at first it lasts 8 hours
              if (start && end && value) {
                const length = Date.parse(`${end}Z`) - Date.parse(`${start}Z`);
                if (length > 0) setEnd(new Date(Date.parse(`${value}Z`) + length).toISOString().slice(0, 16));
              } else if (!end && value) setEnd(new Date(Date.parse(`${value}Z`) + 8 * 3_600_000).toISOString().slice(0, 16));
              setStart(value);
            }}
          />
        </Field>
        <Field id="window-end" label="Ends" required error={problems.end} hint={timeZone ? `On the site's clock, ${timeZone}` : undefined}>
          <TextInput id="window-end" type="datetime-local" value={end} min={start || undefined} invalid={Boolean(problems.end)} onChange={(e) => setEnd(e.target.value)} />
        </Field>
      </div>

      <fieldset className="space-y-3 rounded-lg border border-tide-100 p-3">
        <legend className="px-1 text-sm font-medium text-tide-900">Repeats</legend>
        <Field id="window-repeat" label="How often">
          <Select id="window-repeat" value={choice.kind} onChange={(e) => setChoiceField({ kind: e.target.value as RepeatKind, custom: choice.custom || (recurrenceTyped ?? '') })}>
            {(Object.keys(labels) as RepeatKind[]).map((kind) => (
              <option key={kind} value={kind}>
                {labels[kind]}
              </option>
            ))}
          </Select>
        </Field>
        {unit ? (
          <div className="grid gap-3 sm:grid-cols-2">
            <Field id="window-interval" label={`Every how many ${unit[1]}`}>
              <TextInput
                id="window-interval"
                type="number"
                inputMode="numeric"
                min={1}
                max={366}
                value={choice.interval}
                onChange={(e) => setChoiceField({ interval: Math.max(1, Number(e.target.value) || 1) })}
              />
            </Field>
            <Field id="window-ends" label="Ends">
              <Select id="window-ends" value={choice.ends} onChange={(e) => setChoiceField({ ends: e.target.value as RepeatEnd })}>
                <option value="count">After a number of times</option>
                <option value="until">On a day</option>
                <option value="never">Never</option>
              </Select>
            </Field>
            {choice.ends === 'count' ? (
              <Field id="window-count" label="Times in all">
                <TextInput
                  id="window-count"
                  type="number"
                  inputMode="numeric"
                  min={1}
                  max={1000}
                  value={choice.count}
                  onChange={(e) => setChoiceField({ count: Math.max(1, Number(e.target.value) || 1) })}
                />
              </Field>
            ) : null}
            {choice.ends === 'until' ? (
              <Field id="window-until" label="Last day" hint="No occurrence after this day.">
                <TextInput id="window-until" type="date" value={choice.untilOn} min={start.slice(0, 10) || undefined} onChange={(e) => setChoiceField({ untilOn: e.target.value })} />
              </Field>
            ) : null}
          </div>
        ) : null}
        {choice.kind === 'custom' ? (
          <Field
            id="window-rrule"
            label="Rule (RRULE)"
            error={problems.recurrence}
            hint="For those who write iCalendar rules, e.g. FREQ=WEEKLY;BYDAY=SA,SU;COUNT=10. The start is the first occurrence; times are the site's."
          >
            <TextInput
              id="window-rrule"
              value={choice.custom}
              className="font-mono"
              invalid={Boolean(problems.recurrence)}
              onChange={(e) => setChoiceField({ custom: e.target.value })}
              spellCheck={false}
              autoCapitalize="characters"
            />
          </Field>
        ) : problems.recurrence ? (
          <p className="text-sm font-medium text-eol-600" role="alert">
            {problems.recurrence}
          </p>
        ) : null}
        <div className="rounded-lg bg-tide-50 px-3 py-2 text-sm text-tide-800" aria-live="polite" data-testid="window-rule-check">
          {!recurrenceCheck.ok ? (
            <span className="text-eol-600">{recurrenceCheck.message}</span>
          ) : !startsAt || !endsAt ? (
            <span>Enter the start and end to see when it happens.</span>
          ) : check?.problem ? (
            <span className="text-eol-600">{check.problem}</span>
          ) : (
            <>
              <p>
                <span className="font-medium">{recurrenceCheck.recurrence ? `Repeats ${recurrenceText(recurrenceCheck.recurrence)}` : 'Happens once'}</span>
                {recurrenceCheck.recurrence ? <span className="ml-1 font-mono text-xs text-tide-600">({recurrenceCheck.recurrence})</span> : null}
              </p>
              <ul className="mt-1 space-y-0.5">
                {(check?.next ?? []).map((o) => (
                  <li key={o.startsAt}>{windowTimeText(o.startsAt, o.endsAt, timeZone)}</li>
                ))}
                {check?.more ? <li className="text-tide-600">and more</li> : null}
              </ul>
            </>
          )}
        </div>
      </fieldset>

      <Field id="window-notes" label="Notes" error={problems.notes} hint="Who isolates, permits, access…">
        <TextArea id="window-notes" value={notes} maxLength={2000} onChange={(e) => setNotes(e.target.value)} />
      </Field>
      {problems.form ? (
        <p role="alert" className="text-sm font-medium text-eol-600">
          {problems.form}
        </p>
      ) : null}
      <div className="flex flex-wrap items-center gap-2 border-t border-tide-100 pt-4">
        <Button type="submit" variant="primary" disabled={save.isPending}>
          {save.isPending ? 'Saving…' : window ? 'Save changes' : 'Add shutdown window'}
        </Button>
        <Button onClick={onCancel}>Cancel</Button>
        {window ? (
          <Button
            variant="danger"
            className="sm:ml-auto"
            disabled={retire.isPending}
            onClick={() => {
              if (globalThis.confirm(`Retire ${window.title}? It leaves the calendar; its record stays.`))
                retire.mutate({ id: window.id, version: window.version }, { onSuccess: onSaved, onError: (e) => setProblems({ form: e.message }) });
            }}
          >
            Retire
          </Button>
        ) : (
          <Link to="/planner/windows/import" className="text-sm font-medium text-tide-600 underline sm:ml-auto">
            Import many from a CSV file
          </Link>
        )}
      </div>
    </form>
  );
}

/**
 * The shutdown window form in a dialog: a new window (optionally in a site and area) or a
 * change to `window`. Closes once saved.
 */
export function ShutdownWindowDialog({
  window,
  siteId,
  areaId,
  startLocal,
  onClose,
  onSaved,
}: {
  window?: ShutdownWindow;
  siteId?: string;
  areaId?: string;
  startLocal?: string;
  onClose: () => void;
  onSaved?: (window: ShutdownWindow) => void;
}) {
  return (
    <Modal title={window ? `Change ${window.title}` : 'New shutdown window'} onClose={onClose} width="large">
      <ShutdownWindowForm
        window={window}
        siteId={siteId}
        areaId={areaId}
        startLocal={startLocal}
        onCancel={onClose}
        onSaved={(saved) => {
          onSaved?.(saved);
          onClose();
        }}
      />
    </Modal>
  );
}
