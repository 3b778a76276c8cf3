import { useNavigate } from 'react-router';
import { CAPACITOR_TECHNOLOGIES } from '../../../../../shared/constants/health';
import type { BankDesign } from '../../../../../shared/schemas/bank-design';
import { Badge } from '../../../components/ui/badge';
import { ButtonLink } from '../../../components/ui/button';
import { Card } from '../../../components/ui/card';
import type { DataColumn } from '../../../components/ui/data-table';
import { DetailList } from '../../../components/ui/detail-list';
import { Spinner } from '../../../components/ui/spinner';
import { formatInstant } from '../../../lib/dates';
import { formatMicrofarads, formatOhms, formatRatio, formatSeconds, formatVolts } from '../../../lib/units';
import { bankDesignsApi, useBankDesignRevisions } from '../api/bank-designs';
import { useListParams } from '../hooks/use-list-params';
import { AuditTrail } from './audit-trail';
import { BankDesignForm } from './bank-design-form';
import { BankTable } from './bank-table';
import { FlagToggle, ListResults, ListSearch, ParamSelect } from './list-controls';
import { ReadOnlyNote, useRegisterPermissions } from './permissions';
import { ListToolbar, RecordHeader, RecordLoading, RetireButton } from './record-parts';
import { Tau } from './status-badges';

const columns: DataColumn<BankDesign>[] = [
  { id: 'code', header: 'Code', cell: ({ row }) => <span className="font-mono">{row.original.code}</span> },
  { id: 'name', header: 'Name', meta: { wrap: true }, cell: ({ row }) => row.original.name },
  { id: 'technology', header: 'Technology', cell: ({ row }) => row.original.technology },
  {
    id: 'arrangement',
    header: 'Cans',
    enableSorting: false,
    cell: ({ row }) => `${row.original.seriesCount}S × ${row.original.parallelCount}P of ${formatMicrofarads(row.original.unitCapacitanceMicrofarads)}`,
  },
  { id: 'nominal', header: 'Bank C', enableSorting: false, cell: ({ row }) => formatMicrofarads(row.original.nominalCapacitanceMicrofarads) },
  {
    id: 'limits',
    header: 'Watch / EOL',
    enableSorting: false,
    cell: ({ row }) => `${formatRatio(row.original.watchRatio)} / ${formatRatio(row.original.endOfLifeRatio)}`,
  },
  { id: 'banks', header: 'Banks', enableSorting: false, cell: ({ row }) => row.original.bankCount },
  { id: 'revision', header: 'Rev.', enableSorting: false, cell: ({ row }) => row.original.revision },
];

/** Bank designs: nameplates, limits and intervals shared by many banks. */
export function BankDesignList() {
  const can = useRegisterPermissions();
  const [params, update] = useListParams({ sort: 'code' }, ['technology', 'includeRetired']);
  const designs = bankDesignsApi.useList(params);
  return (
    <section aria-label="Bank designs">
      <ListToolbar
        search={<ListSearch params={params} update={update} label="Search designs" placeholder="Code or name" />}
        action={can.editDesigns ? <ButtonLink to="/register/bank-designs/new" variant="primary">Add bank design</ButtonLink> : undefined}
      >
        <ParamSelect
          params={params}
          update={update}
          name="technology"
          label="Technology"
          allLabel="Any"
          options={CAPACITOR_TECHNOLOGIES.map((t) => ({ value: t, label: t }))}
        />
        <FlagToggle params={params} update={update} name="includeRetired" />
      </ListToolbar>
      <ListResults
        query={designs}
        params={params}
        update={update}
        caption="Bank designs"
        columns={columns}
        rowKey={(d) => d.id}
        rowHref={(d) => `/register/bank-designs/${d.id}`}
        empty="No bank designs match."
        card={(d) => (
          <div>
            <p className="flex justify-between gap-2 font-bold text-tide-900">
              <span className="font-mono">{d.code}</span> <Badge tone={d.technology === 'film' ? 'spark' : 'tide'}>{d.technology}</Badge>
            </p>
            <p className="text-sm text-tide-800">{d.name}</p>
            <p className="mt-1 text-sm text-tide-600">
              {formatMicrofarads(d.nominalCapacitanceMicrofarads)} · watch {formatRatio(d.watchRatio)} · {d.bankCount} banks
            </p>
          </div>
        )}
      />
    </section>
  );
}

/** A bank design: its current revision, every earlier one, the banks of it, and its history. */
export function BankDesignPage({ designId }: { designId: string }) {
  const can = useRegisterPermissions();
  const design = bankDesignsApi.useDetail(designId);
  const revisions = useBankDesignRevisions(designId);
  const audit = bankDesignsApi.useAudit(designId);
  const retire = bankDesignsApi.useRetire(designId);
  if (!design.data) return <RecordLoading query={design} what="bank design" />;
  const d = design.data;
  return (
    <div className="space-y-5">
      <RecordHeader
        back={{ to: '/register/bank-designs', label: 'Bank designs' }}
        kind="Bank design"
        title={
          <>
            <span className="font-mono">{d.code}</span> <span className="text-lg font-medium text-tide-800">{d.name}</span>
          </>
        }
        badges={
          <>
            <Badge tone={d.technology === 'film' ? 'spark' : 'tide'}>{d.technology}</Badge>
            <Badge tone="muted">revision {d.revision}</Badge>
            {d.retiredAt ? <Badge tone="muted">retired</Badge> : null}
          </>
        }
        actions={
          can.editDesigns && !d.retiredAt ? (
            <>
              <ButtonLink to={`/register/bank-designs/${d.id}/edit`}>Edit</ButtonLink>
              <RetireButton
                what={d.code}
                consequence="It leaves the lists but stays with the banks and verdicts that used it. A design with banks in service cannot be retired."
                pending={retire.isPending}
                error={retire.error}
                onRetire={() => retire.mutate(d.version)}
              />
            </>
          ) : undefined
        }
      />
      {!can.editDesigns ? <ReadOnlyNote>Bank designs are kept by reliability engineers.</ReadOnlyNote> : null}
      <div className="grid gap-5 xl:grid-cols-2">
        <Card title="Nameplate">
          <DetailList
            items={[
              { label: 'Cans', value: `${d.seriesCount} in series × ${d.parallelCount} in parallel` },
              { label: 'One can', value: `${formatMicrofarads(d.unitCapacitanceMicrofarads)} / ${formatVolts(d.unitRatedVolts)}` },
              { label: 'Bank capacitance (p × C / s)', value: <b>{formatMicrofarads(d.nominalCapacitanceMicrofarads)}</b> },
              { label: 'Bank rated voltage', value: formatVolts(d.bankRatedVolts) },
              { label: 'Bleeder', value: formatOhms(d.bleederOhms) },
              { id: 'nominal-tau', label: <>Nominal <Tau /> (R × C)</>, value: <b>{formatSeconds(d.nominalTauSeconds)}</b> },
              { label: 'Tolerance', value: `± ${d.capacitanceTolerancePercent} %` },
              { label: 'Temperature coefficient', value: `${d.tempCoefficientPercentPerKelvin} % per K (normalised to 20 °C)` },
              { label: 'Rated life', value: `${d.ratedLifeHours.toLocaleString('en-GB')} h at ${d.ratedLifeCelsius} °C` },
              { label: 'Notes', value: d.notes, wide: true },
            ]}
          />
        </Card>
        <Card title="Limits and interval">
          <DetailList
            items={[
              { label: 'Watch below', value: formatRatio(d.watchRatio) },
              { label: 'End of life below', value: formatRatio(d.endOfLifeRatio) },
              { label: 'Inspect every', value: `${d.inspectionIntervalDays} days` },
              { label: 'Banks in service', value: d.bankCount },
            ]}
          />
          <h3 className="mb-2 mt-5 text-xs font-bold uppercase tracking-wide text-tide-600">Revisions</h3>
          {revisions.data ? (
            <ol className="space-y-2 text-sm" data-testid="revisions">
              {revisions.data.map((r) => (
                <li key={r.id} className="rounded-lg border border-tide-100 px-3 py-2">
                  <p className="font-medium text-tide-900">
                    Revision {r.revision} {r.revision === d.revision ? <Badge tone="ok">current</Badge> : null}
                  </p>
                  <p className="text-tide-800">
                    {formatMicrofarads(r.nominalCapacitanceMicrofarads)}, {formatOhms(r.bleederOhms)}, watch {formatRatio(r.watchRatio)}, end of life{' '}
                    {formatRatio(r.endOfLifeRatio)}
                  </p>
                  <p className="text-xs text-tide-600">
                    {r.changeNote || 'No note'} · {r.createdBy?.name ?? 'Ebbline'}, {formatInstant(r.createdAt)}
                  </p>
                </li>
              ))}
            </ol>
          ) : (
            <Spinner label="Loading revisions…" />
          )}
        </Card>
      </div>
      <Card title="Banks of this design">
        <BankTable fixed={{ bankDesignId: d.id }} />
      </Card>
      <AuditTrail entries={audit.data} isPending={audit.isPending} error={audit.error} />
    </div>
  );
}

export function BankDesignNewScreen() {
  const navigate = useNavigate();
  return (
    <div>
      <RecordHeader back={{ to: '/register/bank-designs', label: 'Bank designs' }} kind="New bank design" title="Add a bank design" />
      <BankDesignForm onSaved={(d) => navigate(`/register/bank-designs/${d.id}`)} onCancel={() => navigate('/register/bank-designs')} />
    </div>
  );
}

export function BankDesignEditScreen({ designId }: { designId: string }) {
  const navigate = useNavigate();
  const design = bankDesignsApi.useDetail(designId);
  if (!design.data) return <RecordLoading query={design} what="bank design" />;
  return (
    <div>
      <RecordHeader back={{ to: `/register/bank-designs/${designId}`, label: design.data.code }} kind="Edit bank design" title={design.data.code} />
      <BankDesignForm
        design={design.data}
        onSaved={() => navigate(`/register/bank-designs/${designId}`)}
        onCancel={() => navigate(`/register/bank-designs/${designId}`)}
      />
    </div>
  );
}
