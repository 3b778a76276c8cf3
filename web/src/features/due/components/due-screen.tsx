import { useState } from 'react';
import { Link } from 'react-router';
import { CRITICALITIES, type Criticality } from '../../../../../shared/constants/register';
import { DUE_BUCKET_LABELS, type DueBucket } from '../../../../../shared/domain/due';
import {
  DUE_HEALTH_LABELS,
  DUE_HEALTHS,
  type DueBank,
  type DueHealth,
} from '../../../../../shared/schemas/due';
import { Badge } from '../../../components/ui/badge';
import { ButtonLink } from '../../../components/ui/button';
import { DataTable, type DataColumn } from '../../../components/ui/data-table';
import { ErrorPanel } from '../../../components/ui/error-panel';
import { PageHeader } from '../../../components/ui/page-header';
import { SearchInput } from '../../../components/ui/search-input';
import { Spinner } from '../../../components/ui/spinner';
import { FilterSelect } from '../../../components/ui/filter-select';
import { useDueList } from '../api/get-due-list';
import { useDueAreas, useDueDesigns, useDueSites } from '../api/get-filter-choices';
import { DUE_FILTERS, useDueParams, type DueParamsUpdate } from '../hooks/use-due-params';
import {
  banksToPlanWith,
  dueWhenText,
  formatDueOn,
  formatSiteTime,
  planVisitHref,
  plannedVisitHref,
} from '../utils/due-text';

/** The Due list's tabs: what needs a visit soonest. */
const TABS: readonly DueBucket[] = ['overdue', 'this-month', 'next-quarter'];

/** The tabs' names on a phone, where the three must fit side by side. */
const SHORT_TAB_LABELS: Record<DueBucket, string> = {
  overdue: 'Overdue',
  'this-month': 'This month',
  'next-quarter': 'Next 3 months',
  later: 'Later',
};

type Params = ReturnType<typeof useDueParams>[0];

/** Every order the API offers, for phones (no column headers) and the columns not shown. */
const SORT_CHOICES = [
  { value: 'dueOn', label: 'Due soonest first' },
  { value: '-dueOn', label: 'Due latest first' },
  { value: '-criticality', label: 'Most critical first' },
  { value: 'lastInspectedOn', label: 'Longest since inspected' },
  { value: 'cabinet', label: 'Cabinet tag' },
  { value: 'site', label: 'Site, area, cabinet' },
  { value: 'area', label: 'Area, site, cabinet' },
  { value: 'design', label: 'Bank design' },
];

/**
 * The Due list: every bank in service by the day it is due for inspection, in tabs (overdue,
 * due this month, due in the next three months) with their counts; filtered, sorted and paged
 * on the server; each row links to its bank, says whether a visit is planned, and offers
 * "Plan a visit" on the Planner.
 */
export function DueScreen() {
  const [params, update] = useDueParams();
  const list = useDueList(params);
  const rows = list.data?.items ?? [];

  return (
    <div>
      <PageHeader
        title="Due"
        lead="Banks due for inspection: at their design’s interval after the last logged visit, sooner when the forecast asks, and at least yearly. Dates are each site’s own."
        actions={<ButtonLink to="/planner">Back to the calendar</ButtonLink>}
      />
      <BucketTabs params={params} update={update} counts={list.data?.counts} />
      <DueFilters params={params} update={update} />
      {list.isPending ? (
        <Spinner label="Loading the Due list…" />
      ) : list.isError ? (
        <ErrorPanel title="The Due list could not be loaded">{list.error.message}</ErrorPanel>
      ) : (
        <DataTable<DueBank>
          caption={`${DUE_BUCKET_LABELS[params.bucket]}: banks`}
          columns={columns(rows)}
          rows={rows}
          total={list.data.total}
          page={params.page}
          pageSize={params.pageSize}
          sort={params.sort}
          onSortChange={(sort) => update({ sort })}
          onPageChange={(page) => update({ page })}
          onPageSizeChange={(pageSize) => update({ pageSize })}
          rowKey={(row) => row.bankId}
          card={(row) => <DueCard bank={row} page={rows} />}
          loading={list.isFetching}
          empty={<EmptyBucket bucket={params.bucket} filtered={hasFilters(params)} />}
        />
      )}
    </div>
  );
}

function hasFilters(params: Params): boolean {
  return ['siteId', 'areaId', 'bankDesignId', 'criticality', 'health', 'planned', 'q'].some(
    (name) => Boolean(params[name]),
  );
}

function EmptyBucket({ bucket, filtered }: { bucket: DueBucket; filtered: boolean }) {
  const what =
    bucket === 'overdue'
      ? 'No bank is overdue'
      : `No bank is ${DUE_BUCKET_LABELS[bucket].toLowerCase()}`;
  return (
    <p>
      {what}
      {filtered ? ' among the banks these filters choose.' : '.'}
    </p>
  );
}

/** The buckets as tabs with their counts (under the same filters). */
function BucketTabs({
  params,
  update,
  counts,
}: {
  params: Params;
  update: DueParamsUpdate;
  counts?: Record<DueBucket, number>;
}) {
  return (
    <div
      role="tablist"
      aria-label="When due"
      className="-mx-4 mb-4 flex gap-1 overflow-x-auto border-b border-tide-100 px-4 sm:mx-0 sm:px-0"
    >
      {TABS.map((bucket) => {
        const selected = params.bucket === bucket;
        const count = counts?.[bucket];
        return (
          <button
            key={bucket}
            type="button"
            role="tab"
            aria-selected={selected}
            onClick={() => update({ bucket })}
            className={`-mb-px flex shrink-0 items-center gap-2 border-b-2 px-3 py-2.5 text-sm font-medium transition ${
              selected
                ? 'border-spark-400 text-tide-900'
                : 'border-transparent text-tide-600 hover:text-tide-900'
            }`}
          >
            <span className="sm:hidden">{SHORT_TAB_LABELS[bucket]}</span>
            <span className="hidden sm:inline">{DUE_BUCKET_LABELS[bucket]}</span>
            <span
              className={`rounded-full px-2 py-0.5 text-xs tabular-nums ${
                bucket === 'overdue' && count
                  ? 'bg-eol-600/10 text-eol-600'
                  : 'bg-tide-50 text-tide-700'
              }`}
            >
              {count === undefined ? '…' : count.toLocaleString('en-GB')}
            </span>
          </button>
        );
      })}
    </div>
  );
}

/** The Due list's filter select: labels a fixed width on a phone, so the stacked filters line up. */
function DueSelect(props: Omit<Parameters<typeof FilterSelect>[0], 'labelClassName'>) {
  return <FilterSelect {...props} labelClassName="w-24 shrink-0 sm:w-auto" />;
}

/** Site, area, design, criticality, health, planned or not, and a search; all in the address bar. */
function DueFilters({ params, update }: { params: Params; update: DueParamsUpdate }) {
  const [shown, setShown] = useState(false);
  const active = DUE_FILTERS.filter((name) => name !== 'q' && Boolean(params[name])).length;
  const siteId = String(params.siteId ?? '');
  const sites = useDueSites();
  const areas = useDueAreas(siteId);
  const designs = useDueDesigns();
  const value = (name: string) => String(params[name] ?? '');
  return (
    <div className="mb-4 grid gap-2 sm:flex sm:flex-wrap sm:items-center sm:gap-3">
      <div className="flex gap-2 sm:contents">
        <SearchInput
          label="Search the Due list"
          placeholder="Cabinet tag, bank or design"
          value={value('q')}
          onSearch={(q) => update({ q })}
        />
        {/* on a phone the filters fold away, so the list starts on the first screen */}
        <button
          type="button"
          aria-expanded={shown}
          aria-controls="due-filters"
          onClick={() => setShown((v) => !v)}
          className="min-h-10 shrink-0 rounded-lg border border-tide-200 bg-white px-3 text-sm font-medium text-tide-800 sm:hidden"
        >
          Filters{active ? ` (${active})` : ''}
        </button>
      </div>
      <div id="due-filters" className={`${shown ? 'grid' : 'hidden'} gap-2 sm:contents`}>
        <DueSelect
          label="Site"
          value={siteId}
          onChange={(v) => update({ siteId: v })}
          options={[
            { value: '', label: 'All sites' },
            ...(sites.data?.items ?? []).map((s) => ({ value: s.id, label: s.name })),
          ]}
        />
        {siteId ? (
          <DueSelect
            label="Area"
            value={value('areaId')}
            onChange={(v) => update({ areaId: v })}
            options={[
              { value: '', label: 'All areas' },
              ...(areas.data?.items ?? []).map((a) => ({ value: a.id, label: a.name })),
            ]}
          />
        ) : null}
        <DueSelect
          label="Design"
          value={value('bankDesignId')}
          onChange={(v) => update({ bankDesignId: v })}
          options={[
            { value: '', label: 'All designs' },
            ...(designs.data?.items ?? []).map((d) => ({ value: d.id, label: d.code })),
          ]}
        />
        <DueSelect
          label="Criticality"
          value={value('criticality')}
          onChange={(v) => update({ criticality: v })}
          options={[
            { value: '', label: 'Any criticality' },
            ...[...CRITICALITIES].reverse().map((c) => ({ value: c, label: c })),
          ]}
        />
        <DueSelect
          label="Health"
          value={value('health')}
          onChange={(v) => update({ health: v })}
          options={[
            { value: '', label: 'Any health' },
            ...DUE_HEALTHS.map((h) => ({ value: h, label: DUE_HEALTH_LABELS[h] })),
          ]}
        />
        <DueSelect
          label="Sort"
          value={String(params.sort)}
          onChange={(v) => update({ sort: v })}
          options={
            SORT_CHOICES.some((c) => c.value === params.sort)
              ? SORT_CHOICES
              : [
                  ...SORT_CHOICES,
                  { value: String(params.sort), label: 'As a column heading chose' },
                ]
          }
        />
        <DueSelect
          label="Visit"
          value={value('planned')}
          onChange={(v) => update({ planned: v })}
          options={[
            { value: '', label: 'Planned or not' },
            { value: 'false', label: 'No visit planned' },
            { value: 'true', label: 'Visit planned' },
          ]}
        />
      </div>
    </div>
  );
}

function CriticalityBadge({ criticality }: { criticality: Criticality }) {
  const tone =
    criticality === 'critical'
      ? 'danger'
      : criticality === 'high'
        ? 'warn'
        : criticality === 'medium'
          ? 'tide'
          : 'muted';
  return <Badge tone={tone}>{criticality}</Badge>;
}

function HealthBadge({ health }: { health: DueHealth }) {
  const tone =
    health === 'healthy'
      ? 'ok'
      : health === 'watch'
        ? 'warn'
        : health === 'end-of-life'
          ? 'danger'
          : 'muted';
  return <Badge tone={tone}>{DUE_HEALTH_LABELS[health]}</Badge>;
}

function BankLink({ bank }: { bank: DueBank }) {
  return (
    <Link
      to={`/register/banks/${bank.bankId}`}
      className="font-medium text-tide-800 underline underline-offset-2 hover:text-tide-950"
    >
      {bank.cabinetTag} · {bank.position}
    </Link>
  );
}

function DueWhen({ bank }: { bank: DueBank }) {
  return (
    <span>
      <span className={bank.daysUntilDue < 0 ? 'font-medium text-eol-600' : 'font-medium'}>
        {formatDueOn(bank.dueOn)}
      </span>
      <span className="block text-xs text-tide-600">
        {dueWhenText(bank)}
      </span>
    </span>
  );
}

function LastInspected({ bank, inline = false }: { bank: DueBank; inline?: boolean }) {
  if (bank.lastInspectedOn) return <span>{formatDueOn(bank.lastInspectedOn)}</span>;
  const since = `${bank.startKind === 'installed' ? 'installed' : 'baseline set'} ${formatDueOn(bank.startOn)}`;
  return (
    <span className="text-tide-600">
      never
      <span className={inline ? '' : 'block text-xs'}>{inline ? ` (${since})` : since}</span>
    </span>
  );
}

/** Whether a visit covers the bank, and a missed last visit. */
function VisitState({ bank }: { bank: DueBank }) {
  const href = plannedVisitHref(bank);
  return (
    <span className="flex flex-col items-start gap-1">
      {bank.plannedVisit && href ? (
        <Link to={href} className="text-sm text-tide-800 underline-offset-2 hover:underline">
          <Badge tone="ok">visit planned</Badge>
          <span className="block whitespace-nowrap underline">
            {formatSiteTime(bank.plannedVisit.plannedStartAt, bank.timeZone)}
          </span>
        </Link>
      ) : (
        <Badge tone="muted">no visit planned</Badge>
      )}
      {bank.missedVisit ? (
        <span className="text-xs text-eol-600">
          <Badge tone="danger">last visit missed</Badge>
          <span className="block whitespace-nowrap">
            {formatSiteTime(bank.missedVisit.plannedStartAt, bank.timeZone)}
          </span>
        </span>
      ) : null}
    </span>
  );
}

function PlanLink({ bank, page }: { bank: DueBank; page: readonly DueBank[] }) {
  if (bank.plannedVisit) return null;
  const bankIds = banksToPlanWith(bank, page);
  const more = bankIds.length - 1;
  return (
    <ButtonLink
      size="sm"
      variant="primary"
      to={planVisitHref(bank, bankIds)}
      aria-label={`Plan a visit to ${bank.cabinetTag} (${bankIds.length} bank${bankIds.length === 1 ? '' : 's'})`}
    >
      Plan a visit
      {more > 0 ? (
        <span className="ml-1 text-xs font-normal">
          +{more} bank{more === 1 ? '' : 's'}
        </span>
      ) : null}
    </ButtonLink>
  );
}

function columns(page: readonly DueBank[]): DataColumn<DueBank>[] {
  return [
    {
      id: 'cabinet',
      header: 'Bank',
      cell: ({ row }) => (
        <span className="block">
          <BankLink bank={row.original} />
          <span className="block text-xs text-tide-600">
            {row.original.siteName} · {row.original.areaName} · {row.original.bankDesignCode}
          </span>
        </span>
      ),
    },
    {
      id: 'dueOn',
      header: 'Due',
      cell: ({ row }) => (
        <span className="block">
          <DueWhen bank={row.original} />
          <span className="block text-xs text-tide-600">
            Last inspected <LastInspected bank={row.original} inline />
          </span>
        </span>
      ),
    },
    {
      id: 'criticality',
      header: 'Criticality · health',
      cell: ({ row }) => (
        <span className="flex flex-col items-start gap-1">
          <CriticalityBadge criticality={row.original.criticality} />
          <HealthBadge health={row.original.health} />
        </span>
      ),
    },
    {
      id: 'visit',
      header: 'Visit',
      enableSorting: false,
      meta: { wrap: true },
      cell: ({ row }) => (
        <span className="flex flex-col items-start gap-2">
          <VisitState bank={row.original} />
          <PlanLink bank={row.original} page={page} />
        </span>
      ),
    },
  ];
}

/** A row on a phone: what is due where, when, and the two ways on. */
function DueCard({ bank, page }: { bank: DueBank; page: readonly DueBank[] }) {
  return (
    <div className="space-y-2 text-sm text-tide-900">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <BankLink bank={bank} />
        <CriticalityBadge criticality={bank.criticality} />
      </div>
      <p className="text-tide-700">
        {bank.siteName} · {bank.areaName} · {bank.bankDesignCode}
      </p>
      <p>
        Due <DueWhen bank={bank} />
      </p>
      <p className="text-tide-700">
        Last inspected <LastInspected bank={bank} inline />
      </p>
      <HealthBadge health={bank.health} />
      <VisitState bank={bank} />
      <PlanLink bank={bank} page={page} />
    </div>
  );
}
