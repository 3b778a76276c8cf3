import { useState } from 'react';
import { ROLE_LABELS, ROLES, type Role } from '../../../../../shared/constants/roles';
import {
  MAX_AVAILABLE_HOURS_PER_WEEK,
  type Person,
} from '../../../../../shared/schemas/person';
import { Badge } from '../../../components/ui/badge';
import { ErrorPanel } from '../../../components/ui/error-panel';
import { Field, TextInput } from '../../../components/ui/field';
import { Spinner } from '../../../components/ui/spinner';
import { formatInstant, fromNow } from '../../../lib/dates';
import { usePeople } from '../api/get-people';
import { useSitesInUse } from '../api/get-sites';
import { useUpdatePerson } from '../api/update-person';
import { changeOfDraft, draftOf, hoursPerWeekText, type PersonDraft } from '../utils/person-change';

/** The People list: search, last sign-in, and an editor per person for roles and access. */
export function PeopleList({ myId }: { myId: string }) {
  const [q, setQ] = useState('');
  const people = usePeople({ q });
  const [editing, setEditing] = useState<string | null>(null);

  return (
    <div className="space-y-4">
      <div className="flex flex-wrap items-center gap-3">
        <label className="relative w-full max-w-sm">
          <span className="sr-only">Search people</span>
          <input
            type="search"
            value={q}
            onChange={(e) => setQ(e.target.value)}
            placeholder="Search by name or e-mail"
            className="w-full rounded-lg border border-tide-200 bg-white px-3 py-2 text-sm shadow-sm placeholder:text-tide-400 focus:border-tide-600 focus:outline-none focus:ring-2 focus:ring-spark-400/60"
          />
        </label>
        {people.data ? (
          <span className="text-sm text-tide-600" data-testid="people-count">
            {people.data.length} {people.data.length === 1 ? 'person' : 'people'}
          </span>
        ) : null}
      </div>

      {people.isPending ? (
        <Spinner label="Loading people…" />
      ) : people.isError ? (
        <ErrorPanel title="People could not be loaded">{people.error.message}</ErrorPanel>
      ) : people.data.length === 0 ? (
        <p className="rounded-xl border border-dashed border-tide-200 bg-white/60 p-6 text-tide-800">
          {q ? `Nobody matches “${q}”.` : 'Nobody has signed in yet.'}
        </p>
      ) : (
        <ul
          className="divide-y divide-tide-100 overflow-hidden rounded-xl border border-tide-100 bg-white shadow-sm"
          data-testid="people-list"
        >
          <li className="hidden grid-cols-[minmax(0,2fr)_minmax(0,2fr)_minmax(0,1.3fr)_7rem] gap-4 bg-tide-50 px-4 py-2 text-xs font-bold uppercase tracking-wide text-tide-600 md:grid">
            <span>Person</span>
            <span>Roles</span>
            <span>Last sign-in</span>
            <span className="sr-only">Actions</span>
          </li>
          {people.data.map((person) => (
            <li key={person.id} data-testid="person-row" data-login={person.email}>
              {editing === person.id ? (
                <PersonEditor
                  person={person}
                  isMe={person.id === myId}
                  onDone={() => setEditing(null)}
                />
              ) : (
                <PersonRow person={person} onEdit={() => setEditing(person.id)} />
              )}
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}

function RoleBadges({ roles }: { roles: readonly Role[] }) {
  if (roles.length === 0) return <Badge tone="warn">No role: waiting for access</Badge>;
  return (
    <span className="flex flex-wrap gap-1">
      {roles.map((r) => (
        <Badge key={r} tone={r === 'admin' ? 'spark' : 'tide'}>
          {ROLE_LABELS[r]}
        </Badge>
      ))}
    </span>
  );
}

function PersonRow({ person, onEdit }: { person: Person; onEdit: () => void }) {
  return (
    <div className="grid grid-cols-[minmax(0,1fr)_auto] gap-x-4 gap-y-2 px-4 py-3 md:grid-cols-[minmax(0,2fr)_minmax(0,2fr)_minmax(0,1.3fr)_7rem] md:items-center">
      <div className="min-w-0">
        <p className="truncate font-medium text-tide-900">
          {person.name} {person.active ? null : <Badge tone="danger">Deactivated</Badge>}
        </p>
        <p className="truncate text-sm text-tide-600">{person.email}</p>
        <WorkLine person={person} />
      </div>
      <div className="col-start-1 md:col-start-auto">
        <RoleBadges roles={person.roles} />
      </div>
      <div className="col-start-1 text-sm text-tide-800 md:col-start-auto">
        {person.lastSignInAt ? (
          <span title={formatInstant(person.lastSignInAt)}>
            <span className="md:hidden">Last sign-in </span>
            {fromNow(person.lastSignInAt)}
          </span>
        ) : (
          <span className="text-tide-600">Never signed in</span>
        )}
      </div>
      <div className="col-start-2 row-start-1 md:col-start-auto md:row-start-auto md:text-right">
        <button
          type="button"
          onClick={onEdit}
          aria-label={`Edit ${person.name}`}
          className="rounded-lg border border-tide-200 px-3 py-1.5 text-sm font-medium text-tide-800 hover:bg-tide-50"
        >
          Edit
        </button>
      </div>
    </div>
  );
}

/** For technicians (and anyone given sites): where they work and their hours for visits. */
function WorkLine({ person }: { person: Person }) {
  if (!person.roles.includes('technician') && person.sites.length === 0) return null;
  return (
    <p className="mt-0.5 text-sm text-tide-800" data-testid="person-work">
      {person.sites.length > 0 ? (
        <>Works at {person.sites.map((s) => s.name).join(', ')}</>
      ) : (
        <span className="text-watch-600">No sites yet</span>
      )}
      <span className="text-tide-600"> · {hoursPerWeekText(person.availableHoursPerWeek)}</span>
    </p>
  );
}

function PersonEditor({
  person,
  isMe,
  onDone,
}: {
  person: Person;
  isMe: boolean;
  onDone: () => void;
}) {
  const [draft, setDraft] = useState<PersonDraft>(() => draftOf(person));
  const [hoursError, setHoursError] = useState<string | null>(null);
  const update = useUpdatePerson();
  const { roles, active } = draft;
  const setRoles = (next: (now: readonly Role[]) => Role[]) =>
    setDraft((d) => ({ ...d, roles: next(d.roles) }));
  const setActive = (value: boolean) => setDraft((d) => ({ ...d, active: value }));
  const checked = changeOfDraft(person, draft);
  const changed = !checked.ok || checked.change !== null;

  const save = () => {
    if (!checked.ok) {
      setHoursError(checked.message);
      return;
    }
    if (!checked.change) return;
    update.mutate({ userId: person.id, change: checked.change }, { onSuccess: onDone });
  };

  return (
    <form
      className="space-y-4 bg-tide-50/60 px-4 py-4"
      aria-label={`Roles and access of ${person.name}`}
      onSubmit={(e) => {
        e.preventDefault();
        save();
      }}
    >
      <div>
        <p className="font-medium text-tide-900">{person.name}</p>
        <p className="text-sm text-tide-600">{person.email}</p>
      </div>
      <fieldset>
        <legend className="mb-2 text-sm font-bold text-tide-800">Roles</legend>
        <div className="grid gap-2 sm:grid-cols-2">
          {ROLES.map((role) => (
            <label
              key={role}
              className="flex items-center gap-2 rounded-lg border border-tide-100 bg-white px-3 py-2 text-sm text-tide-900"
            >
              <input
                type="checkbox"
                className="h-4 w-4 accent-tide-600"
                checked={roles.includes(role)}
                onChange={(e) =>
                  setRoles((now) =>
                    e.target.checked ? [...now, role] : now.filter((r) => r !== role),
                  )
                }
              />
              {ROLE_LABELS[role]}
            </label>
          ))}
        </div>
      </fieldset>
      {roles.includes('technician') || person.sites.length > 0 ? (
        <WorkEditor
          personName={person.name}
          draft={draft}
          hoursError={hoursError}
          onSites={(siteIds) => setDraft((d) => ({ ...d, siteIds }))}
          onHours={(hoursText) => {
            setHoursError(null);
            setDraft((d) => ({ ...d, hoursText }));
          }}
        />
      ) : null}
      <label className="flex items-start gap-2 text-sm text-tide-900">
        <input
          type="checkbox"
          className="mt-0.5 h-4 w-4 accent-tide-600"
          checked={!active}
          disabled={isMe}
          onChange={(e) => setActive(!e.target.checked)}
        />
        <span>
          Deactivated: cannot sign in, sessions end at once, API tokens stop working.
          {isMe ? (
            <span className="block text-tide-600">You cannot deactivate yourself.</span>
          ) : null}
        </span>
      </label>
      {update.isError ? (
        <p role="alert" className="text-sm font-medium text-eol-600">
          {update.error.message}
        </p>
      ) : null}
      <div className="flex gap-2">
        <button
          type="submit"
          disabled={!changed || update.isPending}
          className="rounded-lg bg-tide-800 px-4 py-2 text-sm font-medium text-white hover:bg-tide-600 disabled:opacity-50"
        >
          {update.isPending ? 'Saving…' : 'Save'}
        </button>
        <button
          type="button"
          onClick={onDone}
          className="rounded-lg border border-tide-200 bg-white px-4 py-2 text-sm font-medium text-tide-800 hover:bg-tide-50"
        >
          Cancel
        </button>
      </div>
    </form>
  );
}

/** A technician's sites (they see every visit there) and hours a week available for visits. */
function WorkEditor({
  personName,
  draft,
  hoursError,
  onSites,
  onHours,
}: {
  personName: string;
  draft: PersonDraft;
  hoursError: string | null;
  onSites: (siteIds: string[]) => void;
  onHours: (hoursText: string) => void;
}) {
  const sites = useSitesInUse();
  const hoursId = `hours-${personName.replace(/\W+/g, '-')}`;
  return (
    <div className="space-y-4">
      <fieldset>
        <legend className="text-sm font-bold text-tide-800">Sites</legend>
        <p className="mb-2 text-xs text-tide-600">
          A technician sees every visit at the sites ticked here, besides the visits assigned to them.
        </p>
        {sites.isPending ? (
          <Spinner label="Loading sites…" />
        ) : sites.isError ? (
          <p role="alert" className="text-sm font-medium text-eol-600">
            Sites could not be loaded: {sites.error.message}
          </p>
        ) : sites.data.length === 0 ? (
          <p className="text-sm text-tide-800">No sites yet: add them on Register → Sites.</p>
        ) : (
          <div className="grid max-h-64 gap-2 overflow-y-auto sm:grid-cols-2">
            {sites.data.map((site) => (
              <label
                key={site.id}
                className="flex items-center gap-2 rounded-lg border border-tide-100 bg-white px-3 py-2 text-sm text-tide-900"
              >
                <input
                  type="checkbox"
                  className="h-4 w-4 accent-tide-600"
                  checked={draft.siteIds.includes(site.id)}
                  onChange={(e) =>
                    onSites(
                      e.target.checked
                        ? [...draft.siteIds, site.id]
                        : draft.siteIds.filter((id) => id !== site.id),
                    )
                  }
                />
                <span className="min-w-0">
                  <span className="block truncate">{site.name}</span>
                  <span className="block truncate text-xs text-tide-600">{site.timeZone}</span>
                </span>
              </label>
            ))}
          </div>
        )}
      </fieldset>
      <Field
        id={hoursId}
        label="Hours a week available for visits"
        hint={`0 to ${MAX_AVAILABLE_HOURS_PER_WEEK}; the Planner's week view sets the hours planned against these.`}
        error={hoursError ?? undefined}
        className="max-w-xs"
      >
        <TextInput
          id={hoursId}
          inputMode="decimal"
          value={draft.hoursText}
          invalid={hoursError !== null}
          onChange={(e) => onHours(e.target.value)}
        />
      </Field>
    </div>
  );
}
