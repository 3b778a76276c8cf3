import { zodResolver } from '@hookform/resolvers/zod';
import { useState, type ReactNode } from 'react';
import { useForm, useWatch } from 'react-hook-form';
import { Link, useNavigate } from 'react-router';
import type { z } from 'zod';
import {
  bankBaselineInputSchema,
  bankReplacementInputSchema,
  type BankDetail,
} from '../../../../../shared/schemas/bank';
import { Button, ButtonLink } from '../../../components/ui/button';
import { Card } from '../../../components/ui/card';
import { DetailList } from '../../../components/ui/detail-list';
import { Field, Select, TextInput, UnitInput } from '../../../components/ui/field';
import { formatInstant } from '../../../lib/dates';
import { formatCalendarDate, formatMicrofarads, formatSeconds } from '../../../lib/units';
import { bankDesignsApi } from '../api/bank-designs';
import { banksApi, useReplaceBank, useSetBankBaseline } from '../api/banks';
import { AuditTrail } from './audit-trail';
import { BankForm } from './bank-form';
import { asNumber, FieldQuestion, FormActions, SaveProblem, showServerIssues, unlikelyQuestions } from './form-kit';
import { useRegisterPermissions } from './permissions';
import { RecordHeader, RecordLoading, RetireButton } from './record-parts';
import { BankStatusBadge, BaselineSourceBadge, LatestVerdict, Tau } from './status-badges';

type BaselineValues = z.input<typeof bankBaselineInputSchema>;
const BASELINE_FIELDS = ['source', 'tauSeconds', 'capacitanceMicrofarads', 'note'] as const;

/** A reliability engineer sets the baseline by hand, or back to the nameplate. */
function BaselineForm({ bank, onDone }: { bank: BankDetail; onDone: () => void }) {
  const { register, handleSubmit, setError, control, formState } = useForm<BaselineValues, unknown, z.output<typeof bankBaselineInputSchema>>({
    resolver: zodResolver(bankBaselineInputSchema),
    defaultValues: {
      version: bank.version,
      source: 'manual',
      tauSeconds: bank.baseline.tauSeconds,
      capacitanceMicrofarads: bank.baseline.capacitanceMicrofarads,
      note: '',
    },
  });
  const save = useSetBankBaseline(bank.id);
  const source = useWatch({ control, name: 'source' });
  const e = formState.errors;
  const callbacks = { onSuccess: onDone, onError: (error: unknown) => showServerIssues(error, setError, BASELINE_FIELDS) };
  const submit = handleSubmit((data) => save.mutate(data, callbacks));
  const saveAnyway = () => save.variables && save.mutate({ ...save.variables, confirmed: true }, callbacks);
  return (
    <form onSubmit={submit} noValidate className="mt-4 space-y-4 border-t border-tide-100 pt-4" aria-label="Set the baseline">
      <Field id="source" label="From" error={e.source?.message}>
        <Select id="source" {...register('source')}>
          <option value="manual">Values entered by hand (e.g. a commissioning measurement)</option>
          <option value="nameplate">The design's nameplate (C = p × C / s, τ = R × C)</option>
        </Select>
      </Field>
      {source === 'manual' ? (
        <div className="grid gap-4 sm:grid-cols-2">
          <Field id="tauSeconds" label="Baseline τ" required error={e.tauSeconds?.message}>
            <UnitInput id="tauSeconds" unit="s" invalid={!!e.tauSeconds} {...register('tauSeconds', { setValueAs: asNumber })} />
            <FieldQuestion id="tauSeconds" question={unlikelyQuestions(save.error).tauSeconds} saving={save.isPending} onSaveAnyway={saveAnyway} />
          </Field>
          <Field id="capacitanceMicrofarads" label="Baseline capacitance" required error={e.capacitanceMicrofarads?.message}>
            <UnitInput id="capacitanceMicrofarads" unit="µF" invalid={!!e.capacitanceMicrofarads} {...register('capacitanceMicrofarads', { setValueAs: asNumber })} />
          </Field>
        </div>
      ) : null}
      <Field id="note" label="Why" hint="Kept with the baseline and in the history" error={e.note?.message}>
        <TextInput id="note" {...register('note')} />
      </Field>
      <SaveProblem error={save.error} fields={BASELINE_FIELDS} what="bank" />
      <FormActions saving={save.isPending} saveLabel="Set baseline" onCancel={onDone} />
    </form>
  );
}

type ReplaceValues = z.input<typeof bankReplacementInputSchema>;
const REPLACE_FIELDS = ['bankDesignId', 'serialNumber', 'installedOn', 'note'] as const;

/** Replacing a bank: the new one takes its place, the old one keeps its history. */
function ReplaceForm({ bank, onDone }: { bank: BankDetail; onDone: () => void }) {
  const navigate = useNavigate();
  const designs = bankDesignsApi.useList({ page: 1, pageSize: 100, sort: 'code' });
  const { register, handleSubmit, setError, formState } = useForm<ReplaceValues, unknown, z.output<typeof bankReplacementInputSchema>>({
    resolver: zodResolver(bankReplacementInputSchema),
    defaultValues: { version: bank.version, bankDesignId: bank.bankDesignId, serialNumber: '', installedOn: new Date().toISOString().slice(0, 10), note: '' },
  });
  const replace = useReplaceBank(bank.id);
  const e = formState.errors;
  const callbacks = {
    onSuccess: (next: BankDetail) => navigate(`/register/banks/${next.id}`),
    onError: (error: unknown) => showServerIssues(error, setError, REPLACE_FIELDS),
  };
  const submit = handleSubmit((data) => replace.mutate(data, callbacks));
  const saveAnyway = () => replace.variables && replace.mutate({ ...replace.variables, confirmed: true }, callbacks);
  return (
    <form onSubmit={submit} noValidate className="space-y-4" aria-label="Replace the bank">
      <p className="text-sm text-tide-800">
        The new bank goes in at <b>{bank.position}</b> of {bank.cabinetTag} and starts a new baseline from its nameplate. This bank's record,
        baseline and history stay.
      </p>
      <div className="grid gap-4 sm:grid-cols-2">
        <Field id="installedOn" label="New bank installed on" required error={e.installedOn?.message}>
          <TextInput id="installedOn" type="date" invalid={!!e.installedOn} {...register('installedOn')} />
          <FieldQuestion id="installedOn" question={unlikelyQuestions(replace.error).installedOn} saving={replace.isPending} onSaveAnyway={saveAnyway} />
        </Field>
        <Field id="serialNumber" label="Serial number of the new bank" error={e.serialNumber?.message}>
          <TextInput id="serialNumber" {...register('serialNumber')} />
        </Field>
      </div>
      <Field id="bankDesignId" label="Design of the new bank" error={e.bankDesignId?.message}>
        <Select id="bankDesignId" key={designs.data ? 'loaded' : 'loading'} {...register('bankDesignId')}>
          {designs.data?.items.map((d) => (
            <option key={d.id} value={d.id}>
              {d.code}: {d.name}
            </option>
          ))}
        </Select>
      </Field>
      <Field id="note" label="Why" hint="e.g. bulged cans, end of life at the last visit" error={e.note?.message}>
        <TextInput id="note" {...register('note')} />
      </Field>
      <SaveProblem error={replace.error} fields={REPLACE_FIELDS} what="bank" />
      <FormActions saving={replace.isPending} saveLabel="Replace bank" onCancel={onDone} />
    </form>
  );
}

/**
 * A bank: what it is, its baseline (who set it, when), its replacement chain and its history.
 * `decayCheck` renders the decay check of a bank in service and `decayRuns` the decay runs
 * stored on it (composed by the app, so features stay apart).
 */
export function BankPage({
  bankId,
  decayCheck,
  decayRuns,
}: {
  bankId: string;
  decayCheck?: (bank: BankDetail) => ReactNode;
  decayRuns?: (bank: BankDetail) => ReactNode;
}) {
  const can = useRegisterPermissions();
  const bank = banksApi.useDetail(bankId);
  const audit = banksApi.useAudit(bankId);
  const retire = banksApi.useRetire(bankId);
  const [mode, setMode] = useState<'view' | 'baseline' | 'replace'>('view');
  if (!bank.data) return <RecordLoading query={bank} what="bank" />;
  const b = bank.data;
  const inService = b.status === 'in-service';
  const baselineOutdated = b.baseline.source === 'nameplate' && b.baseline.designRevision !== null && b.baseline.designRevision !== b.designRevision;
  return (
    <div className="space-y-5">
      <RecordHeader
        back={{ to: `/register/cabinets/${b.cabinetId}`, label: b.cabinetTag }}
        kind={`Bank · ${b.cabinetTag}`}
        title={b.position}
        badges={
          <>
            <BankStatusBadge status={b.status} />
            <LatestVerdict verdict={b.latestVerdict} />
          </>
        }
        actions={
          can.editRegister && inService ? (
            <>
              <ButtonLink to={`/register/banks/${b.id}/edit`}>Edit</ButtonLink>
              <Button onClick={() => setMode('replace')}>Replace</Button>
              <RetireButton
                label="Remove"
                what={b.position}
                consequence="The bank leaves the cabinet's list; its record, baseline and history stay. To put a new bank in its place, replace it instead."
                pending={retire.isPending}
                error={retire.error}
                onRetire={() => retire.mutate(b.version)}
              />
            </>
          ) : undefined
        }
      />
      {mode === 'replace' ? (
        <Card title="Replace this bank">
          <ReplaceForm bank={b} onDone={() => setMode('view')} />
        </Card>
      ) : null}
      <div className="grid gap-5 xl:grid-cols-2">
        <Card title="Bank">
          <DetailList
            items={[
              { label: 'Cabinet', value: <Link className="font-mono text-tide-600 underline" to={`/register/cabinets/${b.cabinetId}`}>{b.cabinetTag}</Link> },
              { label: 'Site and area', value: `${b.siteName} · ${b.areaName}` },
              {
                label: 'Design',
                value: (
                  <Link className="text-tide-600 underline" to={`/register/bank-designs/${b.bankDesignId}`}>
                    {b.bankDesignCode} (revision {b.designRevision})
                  </Link>
                ),
              },
              { label: 'Technology', value: b.technology },
              { label: 'Nominal capacitance', value: formatMicrofarads(b.nominalCapacitanceMicrofarads) },
              { label: 'Serial number', value: b.serialNumber },
              { label: 'Installed', value: formatCalendarDate(b.installedOn) },
              { label: 'Replaced', value: formatCalendarDate(b.replacedOn) },
              { label: 'Notes', value: b.notes, wide: true },
            ]}
          />
        </Card>
        <Card title="Baseline">
          <div data-testid="baseline">
            <DetailList
              items={[
                { id: 'tau', label: <><Tau /> (time constant)</>, value: <span className="text-lg font-bold">{formatSeconds(b.baseline.tauSeconds)}</span> },
                { label: 'Capacitance', value: <span className="text-lg font-bold">{formatMicrofarads(b.baseline.capacitanceMicrofarads)}</span> },
                {
                  label: 'Source',
                  value: (
                    <span>
                      <BaselineSourceBadge source={b.baseline.source} />
                      {b.baseline.designRevision ? <span className="ml-1 text-sm text-tide-600">revision {b.baseline.designRevision}</span> : null}
                    </span>
                  ),
                },
                { label: 'Set by', value: `${b.baseline.setBy?.name ?? 'Ebbline'}, ${formatInstant(b.baseline.setAt)}` },
                { label: 'Note', value: b.baseline.note, wide: true },
              ]}
            />
            {baselineOutdated ? (
              <p className="mt-3 rounded-lg bg-watch-600/10 px-3 py-2 text-sm text-tide-900">
                The design is now at revision {b.designRevision}; this nameplate baseline is from revision {b.baseline.designRevision}. Reset it to the
                nameplate if the revision changed the capacitance or bleeder.
              </p>
            ) : null}
            <p className="mt-3 text-xs text-tide-600">
              From the nameplate until a trusted first decay run sets it. Verdicts compare each run's τ and capacitance with this.
            </p>
          </div>
          {can.editBaselines && inService ? (
            mode === 'baseline' ? (
              <BaselineForm bank={b} onDone={() => setMode('view')} />
            ) : (
              <Button className="mt-4" onClick={() => setMode('baseline')}>
                Set baseline
              </Button>
            )
          ) : null}
        </Card>
      </div>
      {decayRuns ? decayRuns(b) : null}
      {decayCheck && inService ? decayCheck(b) : null}
      <Card title="Replacement history">
        {b.lineage.length <= 1 ? (
          <p className="text-sm text-tide-600">The first bank at this position.</p>
        ) : (
          <ol className="space-y-2" data-testid="lineage">
            {b.lineage.map((l, i) => (
              <li key={l.id} className="flex flex-wrap items-center gap-2 text-sm">
                <span className="w-6 text-right font-mono text-tide-600">{i + 1}.</span>
                {l.id === b.id ? (
                  <b>this bank</b>
                ) : (
                  <Link className="text-tide-600 underline" to={`/register/banks/${l.id}`}>
                    {l.serialNumber || 'bank'}
                  </Link>
                )}
                <span className="font-mono">{l.bankDesignCode}</span>
                <span className="text-tide-800">
                  {formatCalendarDate(l.installedOn) || '?'} → {l.replacedOn ? formatCalendarDate(l.replacedOn) : l.status === 'in-service' ? 'now' : l.status}
                </span>
                <BankStatusBadge status={l.status} />
              </li>
            ))}
          </ol>
        )}
      </Card>
      <AuditTrail entries={audit.data} isPending={audit.isPending} error={audit.error} />
    </div>
  );
}

export function BankNewScreen({ cabinetId }: { cabinetId?: string }) {
  const navigate = useNavigate();
  return (
    <div>
      <RecordHeader back={{ to: cabinetId ? `/register/cabinets/${cabinetId}` : '/register/banks', label: 'Back' }} kind="New bank" title="Add a bank" />
      <BankForm cabinetId={cabinetId} onSaved={(b) => navigate(`/register/banks/${b.id}`)} onCancel={() => navigate(-1)} />
    </div>
  );
}

export function BankEditScreen({ bankId }: { bankId: string }) {
  const navigate = useNavigate();
  const bank = banksApi.useDetail(bankId);
  if (!bank.data) return <RecordLoading query={bank} what="bank" />;
  return (
    <div>
      <RecordHeader back={{ to: `/register/banks/${bankId}`, label: bank.data.position }} kind="Edit bank" title={bank.data.position} />
      <BankForm bank={bank.data} onSaved={() => navigate(`/register/banks/${bankId}`)} onCancel={() => navigate(`/register/banks/${bankId}`)} />
    </div>
  );
}
