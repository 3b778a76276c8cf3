import { CABINET_STATUS_LABELS, CABINET_STATUSES, CRITICALITIES } from '../../../../../shared/constants/register';
import type { Cabinet } from '../../../../../shared/schemas/cabinet';
import { ButtonLink } from '../../../components/ui/button';
import { DataTable, type DataColumn } from '../../../components/ui/data-table';
import { ErrorPanel } from '../../../components/ui/error-panel';
import { SearchInput } from '../../../components/ui/search-input';
import { Spinner } from '../../../components/ui/spinner';
import { formatVolts } from '../../../lib/units';
import { cabinetsApi } from '../api/cabinets';
import { sitesApi } from '../api/sites';
import { useListParams } from '../hooks/use-list-params';
import { useRegisterPermissions } from './permissions';
import { FilterSelect, ListToolbar, RetiredToggle } from './record-parts';
import { CabinetStatusBadge, CriticalityBadge } from './status-badges';

const columns: DataColumn<Cabinet>[] = [
  { id: 'tag', header: 'Tag', cell: ({ row }) => <span className="font-mono">{row.original.tag}</span> },
  { id: 'site', header: 'Site', cell: ({ row }) => row.original.siteName },
  { id: 'area', header: 'Area', cell: ({ row }) => row.original.areaName },
  {
    id: 'drive',
    header: 'Drive',
    enableSorting: false,
    cell: ({ row }) => (
      <span>
        {row.original.driveMake} <span className="text-tide-600">{row.original.driveModel}</span>
      </span>
    ),
  },
  { id: 'supply', header: 'Supply', enableSorting: false, cell: ({ row }) => formatVolts(row.original.supplyVolts) },
  { id: 'banks', header: 'Banks', enableSorting: false, cell: ({ row }) => row.original.bankCount },
  { id: 'criticality', header: 'Criticality', cell: ({ row }) => <CriticalityBadge criticality={row.original.criticality} /> },
  { id: 'status', header: 'Status', cell: ({ row }) => <CabinetStatusBadge status={row.original.status} /> },
];

const FILTERS = ['siteId', 'areaId', 'status', 'criticality', 'includeRetired'] as const;

function CabinetCard({ cabinet: c }: { cabinet: Cabinet }) {
  return (
    <div>
      <div className="flex items-start justify-between gap-2">
        <p className="font-mono text-base font-bold text-tide-900">{c.tag}</p>
        <CabinetStatusBadge status={c.status} />
      </div>
      <p className="mt-0.5 text-sm text-tide-800">
        {c.siteName} · {c.areaName}
      </p>
      <p className="mt-1 flex flex-wrap items-center gap-2 text-sm text-tide-600">
        <span>
          {c.driveMake} {c.driveModel}
        </span>
        <span>· {c.bankCount} bank{c.bankCount === 1 ? '' : 's'}</span>
        <CriticalityBadge criticality={c.criticality} />
      </p>
    </div>
  );
}

/** Cabinets, server-paged and sorted; `fixed` pins filters (e.g. one area's cabinets). */
export function CabinetTable({ fixed = {}, toolbar = false }: { fixed?: Record<string, string>; toolbar?: boolean }) {
  const can = useRegisterPermissions();
  const [params, update] = useListParams({ sort: 'tag' }, FILTERS);
  const query = { ...params, ...fixed };
  const cabinets = cabinetsApi.useList(query);
  const sites = sitesApi.useList({ page: 1, pageSize: 100, sort: 'name' }, toolbar);
  return (
    <section aria-label="Cabinets">
      {toolbar ? (
        <ListToolbar
          search={<SearchInput label="Search by tag" placeholder="Tag, e.g. M2-VFD-014" value={params.q ?? ''} onSearch={(q) => update({ q })} />}
          action={
            can.editRegister ? (
              <>
                <ButtonLink to="/register/cabinets/import">Import CSV</ButtonLink>
                <ButtonLink to="/register/cabinets/new" variant="primary">
                  Add cabinet
                </ButtonLink>
              </>
            ) : undefined
          }
        >
          <FilterSelect
            label="Site"
            value={String(params.siteId ?? '')}
            onChange={(siteId) => update({ siteId })}
            options={[{ value: '', label: 'All sites' }, ...(sites.data?.items ?? []).map((s) => ({ value: s.id, label: s.name }))]}
          />
          <FilterSelect
            label="Status"
            value={String(params.status ?? '')}
            onChange={(status) => update({ status })}
            options={[{ value: '', label: 'Any' }, ...CABINET_STATUSES.map((s) => ({ value: s, label: CABINET_STATUS_LABELS[s] }))]}
          />
          <FilterSelect
            label="Criticality"
            value={String(params.criticality ?? '')}
            onChange={(criticality) => update({ criticality })}
            options={[{ value: '', label: 'Any' }, ...CRITICALITIES.map((c) => ({ value: c, label: c }))]}
          />
          <RetiredToggle checked={params.includeRetired === 'true'} onChange={(v) => update({ includeRetired: v ? 'true' : undefined })} />
        </ListToolbar>
      ) : null}
      {cabinets.isPending ? (
        <Spinner label="Loading cabinets…" />
      ) : cabinets.isError ? (
        <ErrorPanel title="Cabinets could not be loaded">{cabinets.error.message}</ErrorPanel>
      ) : (
        <DataTable
          caption="Cabinets"
          columns={columns}
          rows={cabinets.data.items}
          total={cabinets.data.total}
          page={params.page}
          pageSize={params.pageSize}
          sort={params.sort}
          onSortChange={(sort) => update({ sort })}
          onPageChange={(page) => update({ page })}
          onPageSizeChange={(pageSize) => update({ pageSize })}
          rowKey={(c) => c.id}
          rowHref={(c) => `/register/cabinets/${c.id}`}
          loading={cabinets.isFetching}
          empty={params.q ? `No cabinet tag contains “${params.q}”.` : 'No cabinets here yet.'}
          card={(c) => <CabinetCard cabinet={c} />}
        />
      )}
    </section>
  );
}

/** The Cabinets tab: search by tag, filters, and the list. */
export function CabinetList() {
  return <CabinetTable toolbar />;
}
