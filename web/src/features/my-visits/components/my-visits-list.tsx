import { useMemo, useState } from 'react';
import { Link, useSearchParams } from 'react-router';
import type { Visit } from '../../../../../shared/schemas/visit';
import { ErrorPanel } from '../../../components/ui/error-panel';
import { Spinner } from '../../../components/ui/spinner';
import { myVisitRange, useMyVisits, useVisitsAtMySites, useWindowsOfAreas } from '../api/get-my-visits';
import { groupMyVisits, groupTitle, type VisitGroup } from '../utils/group-visits';
import { othersVisits } from '../utils/visit-actions';
import { windowOfVisit } from '../utils/visit-window';
import { VisitCard } from './visit-card';

type View = 'mine' | 'sites';

/**
 * My visits: the visits assigned to me, under way first, then today, later this week and the
 * coming weeks, each on its site's clock; a second tab shows my colleagues' visits at my
 * sites. Phone first: one column of cards.
 */
export function MyVisitsList({ viewerId }: { viewerId: string }) {
  const [now] = useState(() => new Date());
  const range = useMemo(() => myVisitRange(now), [now]);
  const [params, setParams] = useSearchParams();
  const view: View = params.get('view') === 'sites' ? 'sites' : 'mine';
  const mine = useMyVisits(range);
  const atSites = useVisitsAtMySites(range, view === 'sites');
  const shown = view === 'mine' ? mine : atSites;
  const visits = useMemo(
    () =>
      view === 'mine'
        ? (mine.data?.items ?? [])
        : othersVisits(atSites.data?.items ?? [], { id: viewerId }),
    [view, mine.data, atSites.data, viewerId],
  );
  const areaIds = useMemo(() => [...new Set(visits.map((v) => v.areaId))].sort(), [visits]);
  const { windows, loaded: windowsLoaded } = useWindowsOfAreas(areaIds, range);
  const groups = useMemo(() => groupMyVisits(visits, now), [visits, now]);

  return (
    <div className="space-y-5">
      <div role="tablist" aria-label="Whose visits" className="flex gap-1 border-b border-tide-100">
        {(
          [
            ['mine', 'Mine'],
            ['sites', 'Others at my sites'],
          ] as const
        ).map(([id, label]) => (
          <button
            key={id}
            role="tab"
            type="button"
            aria-selected={view === id}
            onClick={() => setParams(id === 'mine' ? {} : { view: id }, { replace: true })}
            className={`-mb-px min-h-10 border-b-2 px-4 py-2 text-sm font-medium transition ${
              view === id ? 'border-spark-400 text-tide-900' : 'border-transparent text-tide-600 hover:text-tide-900'
            }`}
          >
            {label}
          </button>
        ))}
      </div>
      <div role="tabpanel">
        {shown.isPending ? (
          <Spinner label={view === 'mine' ? 'Loading your visits…' : 'Loading the visits at your sites…'} />
        ) : shown.isError ? (
          <ErrorPanel title="The visits could not be loaded">{shown.error.message}</ErrorPanel>
        ) : groups.length === 0 ? (
          view === 'mine' ? <NoVisits /> : <NoneAtMySites />
        ) : (
          <VisitGroups
            groups={groups}
            showTechnicians={view === 'sites'}
            windowOf={(visit) => (windowsLoaded ? windowOfVisit(visit, windows) : undefined)}
          />
        )}
      </div>
      <p className="text-sm text-tide-600">
        Showing visits from two weeks back to six weeks ahead. Times are on each site’s clock.
        To have yours in your phone’s calendar, make your calendar feed on your{' '}
        <Link to="/profile" className="font-medium text-tide-800 underline">
          profile
        </Link>
        .
      </p>
    </div>
  );
}

type WindowOf = (visit: Visit) => ReturnType<typeof windowOfVisit> | undefined;

function VisitGroups({
  groups,
  showTechnicians,
  windowOf,
}: {
  groups: VisitGroup[];
  showTechnicians: boolean;
  windowOf: WindowOf;
}) {
  const firstComing = groups.findIndex((group) => group.kind === 'coming');
  return (
    <div className="space-y-6" data-testid="my-visits">
      {groups.map((group, index) => (
        <div key={group.kind + (group.weekOn ?? '')} className="space-y-6">
          {index === firstComing ? (
            <h2 className="border-t border-tide-100 pt-4 text-xl font-bold text-tide-900">Coming weeks</h2>
          ) : null}
          <GroupSection group={group} showTechnicians={showTechnicians} windowOf={windowOf} />
        </div>
      ))}
    </div>
  );
}

function GroupSection({
  group,
  showTechnicians,
  windowOf,
}: {
  group: VisitGroup;
  showTechnicians: boolean;
  windowOf: WindowOf;
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
            <VisitCard visit={visit} window={windowOf(visit)} showTechnicians={showTechnicians} />
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

/** The other tab, empty: no colleagues' visits at my sites, or no sites yet. */
function NoneAtMySites() {
  return (
    <div className="rounded-xl border border-dashed border-tide-200 bg-white/70 p-6 text-tide-800" data-testid="my-sites-empty">
      <p className="text-lg font-bold text-tide-900">No one else has visits at your sites in the next six weeks</p>
      <p className="mt-2">
        The sites you work at are set by an admin on People. If you expected visits here, ask them which sites you
        have.
      </p>
    </div>
  );
}
