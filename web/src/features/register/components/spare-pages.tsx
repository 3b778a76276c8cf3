import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { useNavigate } from 'react-router';
import type { z } from 'zod';
import { DEFAULT_REFORMING_INTERVAL_DAYS, SPARE_KINDS } from '../../../../../shared/constants/register';
import { spareInputSchema, type Spare } from '../../../../../shared/schemas/spare';
import { Badge } from '../../../components/ui/badge';
import { Button, ButtonLink } from '../../../components/ui/button';
import { Card } from '../../../components/ui/card';
import type { DataColumn } from '../../../components/ui/data-table';
import { DetailList } from '../../../components/ui/detail-list';
import { Field, Select, TextArea, TextInput } from '../../../components/ui/field';
import { formatCalendarDate } from '../../../lib/units';
import { bankDesignsApi } from '../api/bank-designs';
import { sitesApi } from '../api/sites';
import { sparesApi } from '../api/spares';
import { useListParams } from '../hooks/use-list-params';
import { AuditTrail } from './audit-trail';
import { asDate, asNumber, FieldQuestion, FormActions, SaveProblem, showServerIssues, unlikelyQuestions } from './form-kit';
import { FlagToggle, ListResults, ListSearch, ParamSelect, SiteFilter } from './list-controls';
import { useRegisterPermissions } from './permissions';
import { ListToolbar, RecordHeader, RecordLoading, RetireButton } from './record-parts';

function Due({ spare }: { spare: Spare }) {
  return spare.reformingOverdue ? (
    <Badge tone="danger">overdue since {formatCalendarDate(spare.reformingDueOn)}</Badge>
  ) : (
    <span>{formatCalendarDate(spare.reformingDueOn)}</span>
  );
}

const columns: DataColumn<Spare>[] = [
  { id: 'code', header: 'Code', cell: ({ row }) => <span className="font-mono">{row.original.code}</span> },
  { id: 'description', header: 'Spare', enableSorting: false, meta: { wrap: true }, cell: ({ row }) => row.original.description },
  { id: 'kind', header: 'Kind', cell: ({ row }) => row.original.kind },
  { id: 'site', header: 'Stored at', cell: ({ row }) => `${row.original.siteName} · ${row.original.storageLocation}` },
  { id: 'reformed', header: 'Last reformed', enableSorting: false, cell: ({ row }) => formatCalendarDate(row.original.lastReformedOn) || 'never' },
  { id: 'reformingDueOn', header: 'Reforming due', cell: ({ row }) => <Due spare={row.original} /> },
  { id: 'status', header: 'Status', enableSorting: false, cell: ({ row }) => (row.original.status === 'issued' ? <Badge tone="muted">issued</Badge> : 'in store') },
];

/** Spares in store, soonest reforming first; overdue ones stand out. */
export function SpareList() {
  const can = useRegisterPermissions();
  const [params, update] = useListParams({ sort: 'reformingDueOn' }, ['siteId', 'kind', 'overdue', 'includeRetired']);
  const spares = sparesApi.useList(params);
  return (
    <section aria-label="Spares">
      <ListToolbar
        search={<ListSearch params={params} update={update} label="Search spares" placeholder="Code or description" />}
        action={can.editRegister ? <ButtonLink to="/register/spares/new" variant="primary">Add spare</ButtonLink> : undefined}
      >
        <SiteFilter params={params} update={update} />
        <ParamSelect
          params={params}
          update={update}
          name="kind"
          label="Kind"
          allLabel="Any"
          options={SPARE_KINDS.map((k) => ({ value: k, label: k }))}
        />
        <FlagToggle params={params} update={update} name="overdue" label="Overdue only" />
        <FlagToggle params={params} update={update} name="includeRetired" />
      </ListToolbar>
      <ListResults
        query={spares}
        params={params}
        update={update}
        caption="Spares"
        columns={columns}
        rowKey={(s) => s.id}
        rowHref={(s) => `/register/spares/${s.id}`}
        empty="No spares match."
        card={(s) => (
          <div>
            <p className="flex justify-between gap-2 font-bold text-tide-900">
              <span className="font-mono">{s.code}</span> <Due spare={s} />
            </p>
            <p className="text-sm text-tide-800">{s.description}</p>
            <p className="text-sm text-tide-600">
              {s.siteName} · {s.storageLocation}
            </p>
          </div>
        )}
      />
    </section>
  );
}

type Values = z.input<typeof spareInputSchema>;
const FIELDS = ['code', 'kind', 'description', 'siteId', 'bankDesignId', 'storageLocation', 'storageStartedOn', 'lastReformedOn', 'reformingIntervalDays', 'status', 'notes'] as const;

function valuesOf(s?: Spare): Values {
  return {
    code: s?.code ?? '',
    kind: s?.kind ?? 'bank',
    description: s?.description ?? '',
    siteId: s?.siteId ?? '',
    bankDesignId: s?.bankDesignId ?? null,
    storageLocation: s?.storageLocation ?? '',
    storageStartedOn: s?.storageStartedOn ?? new Date().toISOString().slice(0, 10),
    lastReformedOn: s?.lastReformedOn ?? null,
    reformingIntervalDays: s?.reformingIntervalDays ?? DEFAULT_REFORMING_INTERVAL_DAYS,
    status: s?.status ?? 'in-store',
    notes: s?.notes ?? '',
  };
}

export function SpareForm({ spare, onSaved, onCancel }: { spare?: Spare; onSaved: (s: Spare) => void; onCancel: () => void }) {
  const { register, handleSubmit, setError, reset, formState } = useForm<Values, unknown, z.output<typeof spareInputSchema>>({
    resolver: zodResolver(spareInputSchema),
    defaultValues: valuesOf(spare),
  });
  const sites = sitesApi.useList({ page: 1, pageSize: 100, sort: 'name' });
  const designs = bankDesignsApi.useList({ page: 1, pageSize: 100, sort: 'code' });
  const { mutation, save, saveAnyway, reload } = sparesApi.useVersionedSave(spare, {
    onSaved,
    onError: (error) => showServerIssues(error, setError, FIELDS),
    onReloaded: (fresh) => {
      reset(valuesOf(fresh));
    },
  });
  const submit = handleSubmit((data) => save(data, data));
  const e = formState.errors;
  const questions = unlikelyQuestions(mutation.error);
  const ask = (id: 'storageStartedOn' | 'lastReformedOn') => (
    <FieldQuestion id={id} question={questions[id]} saving={mutation.isPending} onSaveAnyway={saveAnyway} />
  );
  return (
    <form onSubmit={submit} noValidate className="max-w-3xl space-y-4" aria-label={spare ? `Edit ${spare.code}` : 'New spare'}>
      <div className="grid gap-4 sm:grid-cols-3">
        <Field id="code" label="Code" required error={e.code?.message}>
          <TextInput id="code" invalid={!!e.code} className="font-mono uppercase" {...register('code')} />
        </Field>
        <Field id="kind" label="Kind" required error={e.kind?.message}>
          <Select id="kind" {...register('kind')}>
            <option value="bank">DC-link bank</option>
            <option value="drive">Whole drive</option>
          </Select>
        </Field>
        <Field id="status" label="Status" error={e.status?.message}>
          <Select id="status" {...register('status')}>
            <option value="in-store">in store</option>
            <option value="issued">issued</option>
          </Select>
        </Field>
      </div>
      <Field id="description" label="Description" required error={e.description?.message}>
        <TextInput id="description" invalid={!!e.description} {...register('description')} />
      </Field>
      <div className="grid gap-4 sm:grid-cols-2">
        <Field id="siteId" label="Stored at site" required error={e.siteId?.message}>
          <Select id="siteId" key={sites.data ? 'loaded' : 'loading'} invalid={!!e.siteId} {...register('siteId')}>
            <option value="">Choose a site…</option>
            {sites.data?.items.map((s) => (
              <option key={s.id} value={s.id}>
                {s.name}
              </option>
            ))}
          </Select>
        </Field>
        <Field id="storageLocation" label="Where in store" error={e.storageLocation?.message}>
          <TextInput id="storageLocation" invalid={!!e.storageLocation} {...register('storageLocation')} />
        </Field>
        <Field id="bankDesignId" label="Bank design" hint="Of the bank, or of the bank inside the drive" error={e.bankDesignId?.message}>
          <Select id="bankDesignId" key={designs.data ? 'loaded' : 'loading'} {...register('bankDesignId', { setValueAs: (v) => (v ? v : null) })}>
            <option value="">Not known</option>
            {designs.data?.items.map((d) => (
              <option key={d.id} value={d.id}>
                {d.code}
              </option>
            ))}
          </Select>
        </Field>
      </div>
      <div className="grid gap-4 sm:grid-cols-3">
        <Field id="storageStartedOn" label="Went into store" required error={e.storageStartedOn?.message}>
          <TextInput id="storageStartedOn" type="date" invalid={!!e.storageStartedOn} {...register('storageStartedOn')} />
          {ask('storageStartedOn')}
        </Field>
        <Field id="lastReformedOn" label="Last reformed" hint="Empty if never" error={e.lastReformedOn?.message}>
          <TextInput id="lastReformedOn" type="date" invalid={!!e.lastReformedOn} {...register('lastReformedOn', { setValueAs: asDate })} />
          {ask('lastReformedOn')}
        </Field>
        <Field id="reformingIntervalDays" label="Reform every" required hint="Days; follow the maker's procedure" error={e.reformingIntervalDays?.message}>
          <TextInput id="reformingIntervalDays" inputMode="numeric" invalid={!!e.reformingIntervalDays} {...register('reformingIntervalDays', { setValueAs: asNumber })} />
        </Field>
      </div>
      <Field id="notes" label="Notes" error={e.notes?.message}>
        <TextArea id="notes" {...register('notes')} />
      </Field>
      <SaveProblem error={mutation.error} fields={FIELDS} what="spare" onReload={reload} />
      <FormActions saving={mutation.isPending} saveLabel={spare ? 'Save changes' : 'Add spare'} onCancel={onCancel} />
    </form>
  );
}

/** A spare: where it is, when it is due for reforming, and its history. */
export function SparePage({ spareId }: { spareId: string }) {
  const can = useRegisterPermissions();
  const spare = sparesApi.useDetail(spareId);
  const audit = sparesApi.useAudit(spareId);
  const update = sparesApi.useUpdate(spareId);
  const retire = sparesApi.useRetire(spareId);
  if (!spare.data) return <RecordLoading query={spare} what="spare" />;
  const s = spare.data;
  const today = new Date().toISOString().slice(0, 10);
  return (
    <div className="space-y-5">
      <RecordHeader
        back={{ to: '/register/spares', label: 'Spares' }}
        kind={`Spare ${s.kind === 'bank' ? 'DC-link bank' : 'drive'}`}
        title={<span className="font-mono">{s.code}</span>}
        badges={
          <>
            {s.reformingOverdue ? <Badge tone="danger">reforming overdue</Badge> : <Badge tone="ok">reforming due {formatCalendarDate(s.reformingDueOn)}</Badge>}
            {s.status === 'issued' ? <Badge tone="muted">issued</Badge> : null}
            {s.retiredAt ? <Badge tone="muted">retired</Badge> : null}
          </>
        }
        actions={
          can.editRegister && !s.retiredAt ? (
            <>
              <Button variant="primary" disabled={update.isPending} onClick={() => update.mutate({ version: s.version, lastReformedOn: today })}>
                Reformed today
              </Button>
              <ButtonLink to={`/register/spares/${s.id}/edit`}>Edit</ButtonLink>
              <RetireButton
                what={s.code}
                consequence="Used up or scrapped: it leaves the lists and stays in the history."
                pending={retire.isPending}
                error={retire.error}
                onRetire={() => retire.mutate(s.version)}
              />
            </>
          ) : undefined
        }
      />
      {update.error ? <SaveProblem error={update.error} what="spare" onReload={() => void spare.refetch().then(() => update.reset())} /> : null}
      <Card title="Details">
        <DetailList
          items={[
            { label: 'Description', value: s.description, wide: true },
            { label: 'Stored at', value: `${s.siteName} · ${s.storageLocation}` },
            { label: 'Bank design', value: s.bankDesignCode },
            { label: 'Went into store', value: formatCalendarDate(s.storageStartedOn) },
            { label: 'Last reformed', value: formatCalendarDate(s.lastReformedOn) || 'never' },
            { label: 'Reform every', value: `${s.reformingIntervalDays} days` },
            { label: 'Reforming due', value: <Due spare={s} /> },
            { label: 'Notes', value: s.notes, wide: true },
          ]}
        />
        <p className="mt-4 text-xs text-tide-600">
          Electrolytics stored unpowered lose oxide: reform them (voltage raised in steps to rated) before use, following the maker's procedure.
        </p>
      </Card>
      <AuditTrail entries={audit.data} isPending={audit.isPending} error={audit.error} />
    </div>
  );
}

export function SpareNewScreen() {
  const navigate = useNavigate();
  return (
    <div>
      <RecordHeader back={{ to: '/register/spares', label: 'Spares' }} kind="New spare" title="Add a spare" />
      <SpareForm onSaved={(s) => navigate(`/register/spares/${s.id}`)} onCancel={() => navigate('/register/spares')} />
    </div>
  );
}

export function SpareEditScreen({ spareId }: { spareId: string }) {
  const navigate = useNavigate();
  const spare = sparesApi.useDetail(spareId);
  if (!spare.data) return <RecordLoading query={spare} what="spare" />;
  return (
    <div>
      <RecordHeader back={{ to: `/register/spares/${spareId}`, label: spare.data.code }} kind="Edit spare" title={spare.data.code} />
      <SpareForm spare={spare.data} onSaved={() => navigate(`/register/spares/${spareId}`)} onCancel={() => navigate(`/register/spares/${spareId}`)} />
    </div>
  );
}
