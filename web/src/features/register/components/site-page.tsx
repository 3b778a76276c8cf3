import { useNavigate } from 'react-router';
import type { Area } from '../../../../../shared/schemas/area';
import { Badge } from '../../../components/ui/badge';
import { ButtonLink } from '../../../components/ui/button';
import { Card } from '../../../components/ui/card';
import { DataTable, type DataColumn } from '../../../components/ui/data-table';
import { DetailList } from '../../../components/ui/detail-list';
import { areasApi } from '../api/areas';
import { sitesApi } from '../api/sites';
import { useListParams } from '../hooks/use-list-params';
import { AuditTrail } from './audit-trail';
import { useRegisterPermissions } from './permissions';
import { RecordHeader, RecordLoading, RetireButton } from './record-parts';
import { SiteForm } from './site-form';

const areaColumns: DataColumn<Area>[] = [
  { id: 'name', header: 'Area', cell: ({ row }) => row.original.name },
  { id: 'description', header: 'What is there', enableSorting: false, meta: { wrap: true }, cell: ({ row }) => row.original.description },
  { id: 'cabinets', header: 'Cabinets', enableSorting: false, cell: ({ row }) => row.original.cabinetCount },
];

/** A site: its details, its areas, and its history. */
export function SitePage({ siteId }: { siteId: string }) {
  const can = useRegisterPermissions();
  const site = sitesApi.useDetail(siteId);
  const audit = sitesApi.useAudit(siteId);
  const retire = sitesApi.useRetire(siteId);
  const [params, update] = useListParams({ sort: 'name', pageSize: 25 });
  const areas = areasApi.useList({ ...params, siteId });
  if (!site.data) return <RecordLoading query={site} what="site" />;
  const s = site.data;
  return (
    <div className="space-y-5">
      <RecordHeader
        back={{ to: '/register/sites', label: 'Sites' }}
        kind="Site"
        title={s.name}
        badges={
          <>
            <Badge>code {s.code}</Badge>
            {s.retiredAt ? <Badge tone="muted">retired</Badge> : null}
          </>
        }
        actions={
          can.editRegister && !s.retiredAt ? (
            <>
              <ButtonLink to={`/register/sites/${s.id}/edit`}>Edit</ButtonLink>
              <RetireButton
                what={s.name}
                consequence="It leaves the lists but stays in the history. A site with areas in use cannot be retired."
                pending={retire.isPending}
                error={retire.error}
                onRetire={() => retire.mutate(s.version)}
              />
            </>
          ) : undefined
        }
      />
      <Card title="Details">
        <DetailList
          items={[
            { label: 'Address', value: s.address, wide: true },
            { label: 'Time zone', value: s.timeZone },
            { label: 'Areas in use', value: s.areaCount },
            { label: 'Cabinets in use', value: s.cabinetCount.toLocaleString('en-GB') },
          ]}
        />
      </Card>
      <Card title="Areas">
        {can.editRegister && !s.retiredAt ? (
          <div className="mb-3">
            <ButtonLink to={`/register/areas/new?siteId=${s.id}`} variant="primary" size="sm">
              Add area
            </ButtonLink>
          </div>
        ) : null}
        {areas.data ? (
          <DataTable
            caption={`Areas of ${s.name}`}
            columns={areaColumns}
            rows={areas.data.items}
            total={areas.data.total}
            page={params.page}
            pageSize={params.pageSize}
            sort={params.sort}
            onSortChange={(sort) => update({ sort })}
            onPageChange={(page) => update({ page })}
            rowKey={(a) => a.id}
            rowHref={(a) => `/register/areas/${a.id}`}
            loading={areas.isFetching}
            empty="No areas yet."
            card={(a) => (
              <div>
                <p className="font-bold text-tide-900">{a.name}</p>
                <p className="text-sm text-tide-800">{a.cabinetCount} cabinets</p>
              </div>
            )}
          />
        ) : (
          <RecordLoading query={areas} what="areas" />
        )}
      </Card>
      <AuditTrail entries={audit.data} isPending={audit.isPending} error={audit.error} />
    </div>
  );
}

export function SiteNewScreen() {
  const navigate = useNavigate();
  return (
    <div>
      <RecordHeader back={{ to: '/register/sites', label: 'Sites' }} kind="New site" title="Add a site" />
      <SiteForm onSaved={(site) => navigate(`/register/sites/${site.id}`)} onCancel={() => navigate('/register/sites')} />
    </div>
  );
}

export function SiteEditScreen({ siteId }: { siteId: string }) {
  const navigate = useNavigate();
  const site = sitesApi.useDetail(siteId);
  if (!site.data) return <RecordLoading query={site} what="site" />;
  return (
    <div>
      <RecordHeader back={{ to: `/register/sites/${siteId}`, label: site.data.name }} kind="Edit site" title={site.data.name} />
      <SiteForm site={site.data} onSaved={() => navigate(`/register/sites/${siteId}`)} onCancel={() => navigate(`/register/sites/${siteId}`)} />
    </div>
  );
}
