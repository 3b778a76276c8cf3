import { useMemo, useState } from 'react';
import { Link } from 'react-router';
import { ErrorPanel } from '../../../components/ui/error-panel';
import { Spinner } from '../../../components/ui/spinner';
import { myVisitRange, useMyVisits, useWindowsOfAreas } from '../api/get-my-visits';
import { groupMyVisits, groupTitle, type VisitGroup } from '../utils/group-visits';
import { windowOfVisit } from '../utils/visit-window';
import { VisitCard } from './visit-card';

/**
 * My visits: the visits assigned to me, under way first, then today, later this week and the
 * coming weeks, each on its site's clock. Phone first: one column of cards.
 */
export function MyVisitsList() {
  const [now] = useState(() => new Date());
  const range = useMemo(() => myVisitRange(now), [now]);
  const visits = useMyVisits(range);
  const areaIds = useMemo(
    () => [...new Set((visits.data?.items ?? []).map((v) => v.areaId))].sort(),
    [visits.data],
  );
  const { windows, loaded: windowsLoaded } = useWindowsOfAreas(areaIds, range);
  const groups = useMemo(() => groupMyVisits(visits.data?.items ?? [], now), [visits.data, now]);

  if (visits.isPending) return <Spinner label="Loading your visits…" />;
  if (visits.isError) {
    return <ErrorPanel title="Your visits could not be loaded">{visits.error.message}</ErrorPanel>;
  }
  if (groups.length === 0) return <NoVisits />;

  const firstComing = groups.findIndex((group) => group.kind === 'coming');
  return (
    <div className="space-y-6" data-testid="my-visits">
      {groups.map((group, index) => {
        const showComing = index === firstComing;
        return (
          <div key={group.kind + (group.weekOn ?? '')} className="space-y-6">
            {showComing ? (
              <h2 className="border-t border-tide-100 pt-4 text-xl font-bold text-tide-900">Coming weeks</h2>
            ) : null}
            <GroupSection
              group={group}
              windowOf={(visit) => (windowsLoaded ? windowOfVisit(visit, windows) : undefined)}
            />
          </div>
        );
      })}
      <p className="text-sm text-tide-600">
        Showing your visits from two weeks back to six weeks ahead. Times are on each site’s clock.
        To have them in your phone’s calendar, make your calendar feed on your{' '}
        <Link to="/profile" className="font-medium text-tide-800 underline">
          profile
        </Link>
        .
      </p>
    </div>
  );
}

function GroupSection({
  group,
  windowOf,
}: {
  group: VisitGroup;
  windowOf: (visit: VisitGroup['visits'][number]) => ReturnType<typeof windowOfVisit> | undefined;
}) {
  const title = groupTitle(group);
  const headingId = `group-${group.kind}-${group.weekOn ?? ''}`;
  return (
    <section aria-labelledby={headingId} className={group.kind === 'earlier' ? 'border-t border-tide-100 pt-4' : ''}>
      <h3
        id={headingId}
        className={`mb-2 flex items-baseline gap-2 font-bold ${group.kind === 'coming' ? 'text-base text-tide-800' : 'text-lg text-tide-900'}`}
      >
        {title}
        <span className="text-sm font-normal text-tide-600">
          {group.visits.length} {group.visits.length === 1 ? 'visit' : 'visits'}
        </span>
      </h3>
      {group.kind === 'earlier' ? (
        <p className="mb-2 text-sm text-tide-800">
          These were not done in time: ask your planner to replan them.
        </p>
      ) : null}
      <ul className="grid gap-3 lg:grid-cols-2">
        {group.visits.map((visit) => (
          <li key={visit.id}>
            <VisitCard visit={visit} window={windowOf(visit)} />
          </li>
        ))}
      </ul>
    </section>
  );
}

/** What a technician with no visits can do. */
function NoVisits() {
  return (
    <div className="rounded-xl border border-dashed border-tide-200 bg-white/70 p-6 text-tide-800" data-testid="my-visits-empty">
      <p className="text-lg font-bold text-tide-900">No visits for you in the next six weeks</p>
      <ul className="mt-3 list-disc space-y-1.5 pl-5">
        <li>Your planner assigns visits on the Planner; each one shows up here with its cabinet, banks and shutdown window.</li>
        <li>Expecting one? Ask your planner to assign it to you.</li>
        <li>
          Meanwhile, the cabinets and banks of every site are in the{' '}
          <Link to="/register/cabinets" className="font-medium text-tide-800 underline">
            Register
          </Link>
          .
        </li>
      </ul>
    </div>
  );
}
