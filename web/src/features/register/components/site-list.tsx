import type { Site } from '../../../../../shared/schemas/site';
import { Badge } from '../../../components/ui/badge';
import { ButtonLink } from '../../../components/ui/button';
import type { DataColumn } from '../../../components/ui/data-table';
import { sitesApi } from '../api/sites';
import { useListParams } from '../hooks/use-list-params';
import { FlagToggle, ListResults, ListSearch } from './list-controls';
import { useRegisterPermissions } from './permissions';
import { ListToolbar } from './record-parts';

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
        search={<ListSearch params={params} update={update} label="Search sites" placeholder="Name or code" />}
        action={can.editRegister ? <ButtonLink to="/register/sites/new" variant="primary">Add site</ButtonLink> : undefined}
      >
        <FlagToggle params={params} update={update} name="includeRetired" />
      </ListToolbar>
      <ListResults
        query={sites}
        params={params}
        update={update}
        caption="Sites"
        columns={columns}
        rowKey={(s) => s.id}
        rowHref={(s) => `/register/sites/${s.id}`}
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
    </section>
  );
}
