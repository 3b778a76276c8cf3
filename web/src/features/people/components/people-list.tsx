import { useState } from 'react';
import { ROLE_LABELS, ROLES, type Role } from '../../../../../shared/constants/roles';
import type { Person } from '../../../../../shared/schemas/person';
import { Badge } from '../../../components/ui/badge';
import { ErrorPanel } from '../../../components/ui/error-panel';
import { Spinner } from '../../../components/ui/spinner';
import { formatInstant, fromNow } from '../../../lib/dates';
import { usePeople } from '../api/get-people';
import { useUpdatePerson } from '../api/update-person';

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

function PersonEditor({
  person,
  isMe,
  onDone,
}: {
  person: Person;
  isMe: boolean;
  onDone: () => void;
}) {
  const [roles, setRoles] = useState<Role[]>(person.roles);
  const [active, setActive] = useState(person.active);
  const update = useUpdatePerson();
  const changed = roles.join() !== person.roles.join() || active !== person.active;

  const save = () =>
    update.mutate(
      { userId: person.id, change: { roles: ROLES.filter((r) => roles.includes(r)), active } },
      { onSuccess: onDone },
    );

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
