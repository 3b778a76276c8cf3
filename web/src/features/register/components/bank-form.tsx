import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm, useWatch } from 'react-hook-form';
import type { z } from 'zod';
import { bankInputSchema, type BankDetail } from '../../../../../shared/schemas/bank';
import { Field, Select, TextArea, TextInput } from '../../../components/ui/field';
import { formatMicrofarads, formatSeconds } from '../../../lib/units';
import { bankDesignsApi } from '../api/bank-designs';
import { banksApi } from '../api/banks';
import { cabinetsApi } from '../api/cabinets';
import { asDate, FieldQuestion, FormActions, SaveProblem, showServerIssues, unlikelyQuestions } from './form-kit';

type Values = z.input<typeof bankInputSchema>;
const FIELDS = ['cabinetId', 'bankDesignId', 'position', 'serialNumber', 'installedOn', 'notes'] as const;

function valuesOf(b?: BankDetail, cabinetId?: string): Values {
  return {
    cabinetId: b?.cabinetId ?? cabinetId ?? '',
    bankDesignId: b?.bankDesignId ?? '',
    position: b?.position ?? '',
    serialNumber: b?.serialNumber ?? '',
    installedOn: b?.installedOn ?? null,
    notes: b?.notes ?? '',
  };
}

/** Picks a cabinet by typing part of its tag. */
function CabinetPicker({ value, onChange, invalid, disabled }: { value: string; onChange: (id: string) => void; invalid: boolean; disabled: boolean }) {
  const [q, setQ] = useState('');
  const current = cabinetsApi.useDetail(value);
  const matches = cabinetsApi.useList({ page: 1, pageSize: 8, sort: 'tag', q }, q.length >= 2 && !disabled);
  if (value && current.data) {
    return (
      <div className="flex items-center justify-between gap-2 rounded-lg border border-tide-200 bg-tide-50 px-3 py-2">
        <span>
          <span className="font-mono font-bold">{current.data.tag}</span>{' '}
          <span className="text-sm text-tide-600">
            {current.data.siteName} · {current.data.areaName}
          </span>
        </span>
        {!disabled ? (
          <button type="button" className="text-sm font-medium text-tide-600 underline" onClick={() => onChange('')}>
            Change
          </button>
        ) : null}
      </div>
    );
  }
  return (
    <div>
      <input
        id="cabinetId"
        type="search"
        placeholder="Type part of the tag, e.g. M2-VFD"
        value={q}
        onChange={(e) => setQ(e.target.value)}
        aria-invalid={invalid || undefined}
        className="block w-full rounded-lg border border-tide-200 bg-white px-3 py-2 text-base shadow-sm focus:border-tide-600 focus:outline-none focus:ring-2 focus:ring-spark-400/60 aria-invalid:border-eol-600 sm:text-sm"
      />
      {matches.data?.items.length ? (
        <ul className="mt-1 divide-y divide-tide-100 rounded-lg border border-tide-100 bg-white shadow-sm" role="listbox" aria-label="Cabinets">
          {matches.data.items.map((c) => (
            <li key={c.id}>
              <button type="button" role="option" aria-selected={false} className="w-full px-3 py-2 text-left hover:bg-tide-50" onClick={() => onChange(c.id)}>
                <span className="font-mono font-bold">{c.tag}</span> <span className="text-sm text-tide-600">{c.areaName}</span>
              </button>
            </li>
          ))}
        </ul>
      ) : q.length >= 2 && matches.data ? (
        <p className="mt-1 text-sm text-tide-600">No cabinet tag contains “{q}”.</p>
      ) : null}
    </div>
  );
}

/** Adding a bank to a cabinet, or changing one. Its baseline starts from the design's nameplate. */
export function BankForm({ bank, cabinetId, onSaved, onCancel }: { bank?: BankDetail; cabinetId?: string; onSaved: (b: BankDetail) => void; onCancel: () => void }) {
  const { register, handleSubmit, setError, reset, formState, control, setValue, clearErrors } = useForm<Values, unknown, z.output<typeof bankInputSchema>>({
    resolver: zodResolver(bankInputSchema),
    defaultValues: valuesOf(bank, cabinetId),
  });
  const designs = bankDesignsApi.useList({ page: 1, pageSize: 100, sort: 'code' });
  const { mutation, save, saveAnyway, reload } = banksApi.useVersionedSave(bank, {
    onSaved,
    onError: (error) => showServerIssues(error, setError, FIELDS),
    onReloaded: (fresh) => {
      reset(valuesOf(fresh));
    },
  });
  const designId = useWatch({ control, name: 'bankDesignId' });
  const design = designs.data?.items.find((d) => d.id === designId);
  const chosenCabinet = useWatch({ control, name: 'cabinetId' });

  const submit = handleSubmit((data) => {
    const { cabinetId: _cabinet, ...change } = data;
    save(data, change);
  });
  const e = formState.errors;
  return (
    <form onSubmit={submit} noValidate className="max-w-2xl space-y-4" aria-label={bank ? `Edit bank ${bank.position}` : 'New bank'}>
      <Field id="cabinetId" label="Cabinet" required error={e.cabinetId?.message}>
        <CabinetPicker
          value={chosenCabinet}
          invalid={!!e.cabinetId}
          disabled={!!bank}
          onChange={(id) => {
            setValue('cabinetId', id);
            clearErrors('cabinetId');
          }}
        />
      </Field>
      <div className="grid gap-4 sm:grid-cols-2">
        <Field id="position" label="Position" required hint="Which DC link, e.g. Drive 1 DC link" error={e.position?.message}>
          <TextInput id="position" invalid={!!e.position} {...register('position')} />
        </Field>
        <Field id="serialNumber" label="Serial number" error={e.serialNumber?.message}>
          <TextInput id="serialNumber" invalid={!!e.serialNumber} {...register('serialNumber')} />
        </Field>
      </div>
      <Field
        id="bankDesignId"
        label="Bank design"
        required
        error={e.bankDesignId?.message}
        hint={bank ? 'Correcting the design moves a nameplate baseline with it; a new bank is a replacement' : undefined}
      >
        <Select id="bankDesignId" key={designs.data ? 'loaded' : 'loading'} invalid={!!e.bankDesignId} {...register('bankDesignId')}>
          <option value="">Choose a design…</option>
          {designs.data?.items.map((d) => (
            <option key={d.id} value={d.id}>
              {d.code}: {d.name}
            </option>
          ))}
        </Select>
      </Field>
      {design ? (
        <p className="rounded-lg bg-tide-100/60 px-3 py-2 text-sm text-tide-900" data-testid="nameplate-preview">
          Nameplate: {design.parallelCount} × {formatMicrofarads(design.unitCapacitanceMicrofarads)} / {design.seriesCount} ={' '}
          <b>{formatMicrofarads(design.nominalCapacitanceMicrofarads)}</b>, τ = R × C = <b>{formatSeconds(design.nominalTauSeconds)}</b>. This is the
          baseline until a trusted decay run sets it.
        </p>
      ) : null}
      <Field id="installedOn" label="Installed on" error={e.installedOn?.message}>
        <TextInput id="installedOn" type="date" invalid={!!e.installedOn} {...register('installedOn', { setValueAs: asDate })} />
        <FieldQuestion id="installedOn" question={unlikelyQuestions(mutation.error).installedOn} saving={mutation.isPending} onSaveAnyway={saveAnyway} />
      </Field>
      <Field id="notes" label="Notes" error={e.notes?.message}>
        <TextArea id="notes" invalid={!!e.notes} {...register('notes')} />
      </Field>
      <SaveProblem error={mutation.error} fields={FIELDS} what="bank" onReload={reload} />
      <FormActions saving={mutation.isPending} saveLabel={bank ? 'Save changes' : 'Add bank'} onCancel={onCancel} />
    </form>
  );
}
