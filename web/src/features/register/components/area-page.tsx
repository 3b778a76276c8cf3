import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { useNavigate } from 'react-router';
import type { z } from 'zod';
import { areaInputSchema, type Area } from '../../../../../shared/schemas/area';
import { Badge } from '../../../components/ui/badge';
import { ButtonLink } from '../../../components/ui/button';
import { Card } from '../../../components/ui/card';
import { DetailList } from '../../../components/ui/detail-list';
import { Field, Select, TextArea, TextInput } from '../../../components/ui/field';
import { areasApi } from '../api/areas';
import { sitesApi } from '../api/sites';
import { AuditTrail } from './audit-trail';
import { CabinetTable } from './cabinet-list';
import { FormActions, SaveProblem, showServerIssues } from './form-kit';
import { useRegisterPermissions } from './permissions';
import { RecordHeader, RecordLoading, RetireButton } from './record-parts';

type Values = z.input<typeof areaInputSchema>;
const FIELDS = ['siteId', 'name', 'description'] as const;

/** Adding an area to a site, or changing one. */
export function AreaForm({ area, siteId, onSaved, onCancel }: { area?: Area; siteId?: string; onSaved: (a: Area) => void; onCancel: () => void }) {
  const valuesOf = (a?: Area): Values => ({ siteId: a?.siteId ?? siteId ?? '', name: a?.name ?? '', description: a?.description ?? '' });
  const { register, handleSubmit, setError, reset, formState } = useForm<Values, unknown, z.output<typeof areaInputSchema>>({
    resolver: zodResolver(areaInputSchema),
    defaultValues: valuesOf(area),
  });
  const sites = sitesApi.useList({ page: 1, pageSize: 100, sort: 'name' });
  const { mutation, save, reload } = areasApi.useVersionedSave(area, {
    onSaved,
    onError: (error) => showServerIssues(error, setError, FIELDS),
    onReloaded: (fresh) => {
      reset(valuesOf(fresh));
    },
  });
  const submit = handleSubmit((data) => save(data, { name: data.name, description: data.description }));
  const e = formState.errors;
  return (
    <form onSubmit={submit} noValidate className="max-w-2xl space-y-4" aria-label={area ? `Edit ${area.name}` : 'New area'}>
      <Field id="siteId" label="Site" required error={e.siteId?.message} hint={area ? 'An area stays in its site' : undefined}>
        <Select id="siteId" key={sites.data ? 'loaded' : 'loading'} invalid={!!e.siteId} disabled={!!area} {...register('siteId')}>
          <option value="">Choose a site…</option>
          {sites.data?.items.map((s) => (
            <option key={s.id} value={s.id}>
              {s.name} ({s.code})
            </option>
          ))}
        </Select>
      </Field>
      <Field id="name" label="Name" required hint="A line, hall or plant room, e.g. Line 2 milling" error={e.name?.message}>
        <TextInput id="name" invalid={!!e.name} {...register('name')} />
      </Field>
      <Field id="description" label="What is there" error={e.description?.message}>
        <TextArea id="description" invalid={!!e.description} {...register('description')} />
      </Field>
      <SaveProblem error={mutation.error} fields={FIELDS} what="area" onReload={reload} />
      <FormActions saving={mutation.isPending} saveLabel={area ? 'Save changes' : 'Add area'} onCancel={onCancel} />
    </form>
  );
}

/** An area: details, its cabinets, its history. */
export function AreaPage({ areaId }: { areaId: string }) {
  const can = useRegisterPermissions();
  const area = areasApi.useDetail(areaId);
  const audit = areasApi.useAudit(areaId);
  const retire = areasApi.useRetire(areaId);
  if (!area.data) return <RecordLoading query={area} what="area" />;
  const a = area.data;
  return (
    <div className="space-y-5">
      <RecordHeader
        back={{ to: `/register/sites/${a.siteId}`, label: a.siteName }}
        kind="Area"
        title={a.name}
        badges={a.retiredAt ? <Badge tone="muted">retired</Badge> : undefined}
        actions={
          can.editRegister && !a.retiredAt ? (
            <>
              <ButtonLink to={`/register/cabinets/new?areaId=${a.id}`} variant="primary">
                Add cabinet
              </ButtonLink>
              <ButtonLink to={`/register/areas/${a.id}/edit`}>Edit</ButtonLink>
              <RetireButton
                what={a.name}
                consequence="It leaves the lists but stays in the history. An area with cabinets in use cannot be retired."
                pending={retire.isPending}
                error={retire.error}
                onRetire={() => retire.mutate(a.version)}
              />
            </>
          ) : undefined
        }
      />
      <Card title="Details">
        <DetailList
          items={[
            { label: 'Site', value: a.siteName },
            { label: 'Cabinets in use', value: a.cabinetCount },
            { label: 'What is there', value: a.description, wide: true },
          ]}
        />
      </Card>
      <Card title="Cabinets">
        <CabinetTable fixed={{ areaId: a.id }} />
      </Card>
      <AuditTrail entries={audit.data} isPending={audit.isPending} error={audit.error} />
    </div>
  );
}

export function AreaNewScreen({ siteId }: { siteId?: string }) {
  const navigate = useNavigate();
  const back = siteId ? `/register/sites/${siteId}` : '/register/sites';
  return (
    <div>
      <RecordHeader back={{ to: back, label: 'Back' }} kind="New area" title="Add an area" />
      <AreaForm siteId={siteId} onSaved={(a) => navigate(`/register/areas/${a.id}`)} onCancel={() => navigate(back)} />
    </div>
  );
}

export function AreaEditScreen({ areaId }: { areaId: string }) {
  const navigate = useNavigate();
  const area = areasApi.useDetail(areaId);
  if (!area.data) return <RecordLoading query={area} what="area" />;
  return (
    <div>
      <RecordHeader back={{ to: `/register/areas/${areaId}`, label: area.data.name }} kind="Edit area" title={area.data.name} />
      <AreaForm area={area.data} onSaved={() => navigate(`/register/areas/${areaId}`)} onCancel={() => navigate(`/register/areas/${areaId}`)} />
    </div>
  );
}
