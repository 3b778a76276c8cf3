import type { Site } from '../../../../../shared/schemas/site';
import { Badge } from '../../../components/ui/badge';
import { ButtonLink } from '../../../components/ui/button';
import { DataTable, type DataColumn } from '../../../components/ui/data-table';
import { ErrorPanel } from '../../../components/ui/error-panel';
import { SearchInput } from '../../../components/ui/search-input';
import { Spinner } from '../../../components/ui/spinner';
import { sitesApi } from '../api/sites';
import { useListParams } from '../hooks/use-list-params';
import { useRegisterPermissions } from './permissions';
import { ListToolbar, RetiredToggle } from './record-parts';

const columns: DataColumn<Site>[] = [
  { id: 'name', header: 'Site', cell: ({ row }) => row.original.name },
  { id: 'code', header: 'Code', cell: ({ row }) => <span className="font-mono">{row.original.code}</span> },
  { id: 'areas', header: 'Areas', enableSorting: false, cell: ({ row }) => row.original.areaCount },
  { id: 'cabinets', header: 'Cabinets', enableSorting: false, cell: ({ row }) => row.original.cabinetCount.toLocaleString('en-GB') },
  { id: 'timeZone', header: 'Time zone', enableSorting: false, cell: ({ row }) => row.original.timeZone },
];

/** The plant group's sites. */
export function SiteList() {
  const can = useRegisterPermissions();
  const [params, update] = useListParams({ sort: 'name' }, ['includeRetired']);
  const sites = sitesApi.useList(params);
  return (
    <section aria-label="Sites">
      <ListToolbar
          search={<SearchInput label="Search sites" placeholder="Name or code" value={params.q ?? ''} onSearch={(q) => update({ q })} />}
        action={can.editRegister ? <ButtonLink to="/register/sites/new" variant="primary">Add site</ButtonLink> : undefined}
      >
        <RetiredToggle checked={params.includeRetired === 'true'} onChange={(v) => update({ includeRetired: v ? 'true' : undefined })} />
      </ListToolbar>
      {sites.isPending ? (
        <Spinner label="Loading sites…" />
      ) : sites.isError ? (
        <ErrorPanel title="Sites could not be loaded">{sites.error.message}</ErrorPanel>
      ) : (
        <DataTable
          caption="Sites"
          columns={columns}
          rows={sites.data.items}
          total={sites.data.total}
          page={params.page}
          pageSize={params.pageSize}
          sort={params.sort}
          onSortChange={(sort) => update({ sort })}
          onPageChange={(page) => update({ page })}
          onPageSizeChange={(pageSize) => update({ pageSize })}
          rowKey={(s) => s.id}
          rowHref={(s) => `/register/sites/${s.id}`}
          loading={sites.isFetching}
          empty={params.q ? `No site matches “${params.q}”.` : 'No sites yet.'}
          card={(s) => (
            <div>
              <p className="flex items-center justify-between font-bold text-tide-900">
                {s.name} <span className="font-mono text-sm text-tide-600">{s.code}</span>
              </p>
              <p className="mt-1 text-sm text-tide-800">
                {s.areaCount} areas · {s.cabinetCount.toLocaleString('en-GB')} cabinets {s.retiredAt ? <Badge tone="muted">retired</Badge> : null}
              </p>
            </div>
          )}
        />
      )}
    </section>
  );
}
