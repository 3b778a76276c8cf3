import { CABINET_STATUS_LABELS, CABINET_STATUSES, CRITICALITIES } from '../../../../../shared/constants/register';
import type { Cabinet } from '../../../../../shared/schemas/cabinet';
import { ButtonLink } from '../../../components/ui/button';
import type { DataColumn } from '../../../components/ui/data-table';
import { formatVolts } from '../../../lib/units';
import { cabinetsApi } from '../api/cabinets';
import { useListParams } from '../hooks/use-list-params';
import { FlagToggle, ListResults, ListSearch, ParamSelect, SiteFilter } from './list-controls';
import { useRegisterPermissions } from './permissions';
import { ListToolbar } from './record-parts';
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
  return (
    <section aria-label="Cabinets">
      {toolbar ? (
        <ListToolbar
          search={<ListSearch params={params} update={update} label="Search by tag" placeholder="Tag, e.g. M2-VFD-014" />}
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
          <SiteFilter params={params} update={update} />
          <ParamSelect
            params={params}
            update={update}
            name="status"
            label="Status"
            allLabel="Any"
            options={CABINET_STATUSES.map((s) => ({ value: s, label: CABINET_STATUS_LABELS[s] }))}
          />
          <ParamSelect
            params={params}
            update={update}
            name="criticality"
            label="Criticality"
            allLabel="Any"
            options={CRITICALITIES.map((c) => ({ value: c, label: c }))}
          />
          <FlagToggle params={params} update={update} name="includeRetired" />
        </ListToolbar>
      ) : null}
      <ListResults
        query={cabinets}
        params={params}
        update={update}
        caption="Cabinets"
        columns={columns}
        rowKey={(c) => c.id}
        rowHref={(c) => `/register/cabinets/${c.id}`}
        empty={params.q ? `No cabinet tag contains “${params.q}”.` : 'No cabinets here yet.'}
        card={(c) => <CabinetCard cabinet={c} />}
      />
    </section>
  );
}

/** The Cabinets tab: search by tag, filters, and the list. */
export function CabinetList() {
  return <CabinetTable toolbar />;
}
