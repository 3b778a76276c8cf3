import { zodResolver } from '@hookform/resolvers/zod';
import { useForm, useWatch } from 'react-hook-form';
import type { z } from 'zod';
import { CAPACITOR_TECHNOLOGIES, type CapacitorTechnology } from '../../../../../shared/constants/health';
import {
  bankDesignFormSchema,
  bankRatedVolts,
  defaultDesignLimits,
  type BankDesign,
} from '../../../../../shared/schemas/bank-design';
import { bankCapacitanceMicrofarads, tauSecondsOf } from '../../../../../shared/domain/capacitance';
import { Field, Select, TextArea, TextInput, UnitInput } from '../../../components/ui/field';
import { formatMicrofarads, formatSeconds, formatVolts } from '../../../lib/units';
import { bankDesignsApi } from '../api/bank-designs';
import { asNumber, FormActions, SaveProblem, showServerIssues } from './form-kit';

type Values = z.input<typeof bankDesignFormSchema>;
const FIELDS = [
  'code',
  'name',
  'notes',
  'technology',
  'unitCapacitanceMicrofarads',
  'unitRatedVolts',
  'seriesCount',
  'parallelCount',
  'bleederOhms',
  'capacitanceTolerancePercent',
  'tempCoefficientPercentPerKelvin',
  'ratedLifeHours',
  'ratedLifeCelsius',
  'watchRatio',
  'endOfLifeRatio',
  'inspectionIntervalDays',
  'changeNote',
] as const;

function valuesOf(d?: BankDesign): Values {
  const technology: CapacitorTechnology = d?.technology ?? 'electrolytic';
  const defaults = defaultDesignLimits(technology);
  const blank = null as unknown as number;
  return {
    code: d?.code ?? '',
    name: d?.name ?? '',
    notes: d?.notes ?? '',
    technology,
    unitCapacitanceMicrofarads: d?.unitCapacitanceMicrofarads ?? blank,
    unitRatedVolts: d?.unitRatedVolts ?? 450,
    seriesCount: d?.seriesCount ?? 2,
    parallelCount: d?.parallelCount ?? 1,
    bleederOhms: d?.bleederOhms ?? blank,
    capacitanceTolerancePercent: d?.capacitanceTolerancePercent ?? 20,
    tempCoefficientPercentPerKelvin: d?.tempCoefficientPercentPerKelvin ?? 0.25,
    ratedLifeHours: d?.ratedLifeHours ?? 5000,
    ratedLifeCelsius: d?.ratedLifeCelsius ?? 105,
    watchRatio: d?.watchRatio ?? defaults.watchRatio,
    endOfLifeRatio: d?.endOfLifeRatio ?? defaults.endOfLifeRatio,
    inspectionIntervalDays: d?.inspectionIntervalDays ?? defaults.inspectionIntervalDays,
    changeNote: '',
  };
}

/**
 * A bank design's nameplate, limits and interval. Changing a technical field of an existing
 * design makes a new revision; verdicts already made keep theirs.
 */
export function BankDesignForm({ design, onSaved, onCancel }: { design?: BankDesign; onSaved: (d: BankDesign) => void; onCancel: () => void }) {
  const { register, handleSubmit, setError, reset, formState, control, setValue } = useForm<Values, unknown, z.output<typeof bankDesignFormSchema>>({
    resolver: zodResolver(bankDesignFormSchema),
    defaultValues: valuesOf(design),
  });
  const { mutation, save, reload } = bankDesignsApi.useVersionedSave(design, {
    onSaved,
    onError: (error) => showServerIssues(error, setError, FIELDS),
    onReloaded: (fresh) => {
      reset(valuesOf(fresh));
    },
  });
  const submit = handleSubmit(({ changeNote, ...data }) => save(data, { ...data, changeNote }));
  const [c, s, p, r, v] = useWatch({ control, name: ['unitCapacitanceMicrofarads', 'seriesCount', 'parallelCount', 'bleederOhms', 'unitRatedVolts'] });
  // the preview waits for whole counts: the engine refuses half a can
  const nominal =
    typeof c === 'number' && c > 0 && Number.isInteger(s) && s > 0 && Number.isInteger(p) && p > 0
      ? bankCapacitanceMicrofarads({ unitCapacitanceMicrofarads: c, seriesCount: s, parallelCount: p })
      : null;
  const tau = nominal && typeof r === 'number' && r > 0 ? tauSecondsOf(r, nominal) : null;
  const e = formState.errors;
  const num = { setValueAs: asNumber };
  return (
    <form onSubmit={submit} noValidate className="max-w-3xl space-y-6" aria-label={design ? `Edit ${design.code}` : 'New bank design'}>
      <fieldset className="grid gap-4 sm:grid-cols-[12rem_1fr]">
        <legend className="mb-2 text-sm font-bold uppercase tracking-wide text-tide-600">Design</legend>
        <Field id="code" label="Code" required error={e.code?.message}>
          <TextInput id="code" invalid={!!e.code} className="font-mono uppercase" {...register('code')} />
        </Field>
        <Field id="name" label="Name" required error={e.name?.message}>
          <TextInput id="name" invalid={!!e.name} {...register('name')} />
        </Field>
      </fieldset>

      <fieldset className="space-y-4">
        <legend className="mb-2 text-sm font-bold uppercase tracking-wide text-tide-600">Nameplate</legend>
        <div className="grid gap-4 sm:grid-cols-3">
          <Field id="technology" label="Technology" required error={e.technology?.message}>
            <Select
              id="technology"
              invalid={!!e.technology}
              {...register('technology', {
                onChange: (ev) => {
                  if (design) return;
                  const limits = defaultDesignLimits(ev.target.value as CapacitorTechnology);
                  setValue('watchRatio', limits.watchRatio);
                  setValue('endOfLifeRatio', limits.endOfLifeRatio);
                },
              })}
            >
              {CAPACITOR_TECHNOLOGIES.map((t) => (
                <option key={t} value={t}>
                  {t}
                </option>
              ))}
            </Select>
          </Field>
          <Field id="unitCapacitanceMicrofarads" label="Capacitance of one can" required error={e.unitCapacitanceMicrofarads?.message}>
            <UnitInput id="unitCapacitanceMicrofarads" unit="µF" invalid={!!e.unitCapacitanceMicrofarads} {...register('unitCapacitanceMicrofarads', num)} />
          </Field>
          <Field id="unitRatedVolts" label="Rated voltage of one can" required error={e.unitRatedVolts?.message}>
            <UnitInput id="unitRatedVolts" unit="V" invalid={!!e.unitRatedVolts} {...register('unitRatedVolts', num)} />
          </Field>
          <Field id="seriesCount" label="Cans in series (s)" required hint="2 for a series pair" error={e.seriesCount?.message}>
            <TextInput id="seriesCount" inputMode="numeric" invalid={!!e.seriesCount} {...register('seriesCount', num)} />
          </Field>
          <Field id="parallelCount" label="Strings in parallel (p)" required error={e.parallelCount?.message}>
            <TextInput id="parallelCount" inputMode="numeric" invalid={!!e.parallelCount} {...register('parallelCount', num)} />
          </Field>
          <Field id="bleederOhms" label="Bleeder resistance" required hint="Across the whole bus" error={e.bleederOhms?.message}>
            <UnitInput id="bleederOhms" unit="Ω" invalid={!!e.bleederOhms} {...register('bleederOhms', num)} />
          </Field>
        </div>
        <p className="rounded-lg bg-tide-100/60 px-3 py-2 text-sm text-tide-900" data-testid="design-nominal">
          {nominal ? (
            <>
              C_bank = p × C / s = <b>{formatMicrofarads(nominal)}</b>
              {tau ? (
                <>
                  {' '}
                  · τ = R × C = <b>{formatSeconds(tau)}</b>
                </>
              ) : null}
              {typeof v === 'number' && s > 0 ? <> · rated {formatVolts(bankRatedVolts(v, s))}</> : null}
            </>
          ) : (
            'Enter the cans and the bleeder to see the bank’s nominal capacitance and τ.'
          )}
        </p>
        <div className="grid gap-4 sm:grid-cols-2">
          <Field id="capacitanceTolerancePercent" label="Capacitance tolerance" required error={e.capacitanceTolerancePercent?.message}>
            <UnitInput id="capacitanceTolerancePercent" unit="± %" invalid={!!e.capacitanceTolerancePercent} {...register('capacitanceTolerancePercent', num)} />
          </Field>
          <Field
            id="tempCoefficientPercentPerKelvin"
            label="Temperature coefficient"
            required
            hint="Capacitance change per K, to normalise readings to 20 °C"
            error={e.tempCoefficientPercentPerKelvin?.message}
          >
            <UnitInput id="tempCoefficientPercentPerKelvin" unit="%/K" invalid={!!e.tempCoefficientPercentPerKelvin} {...register('tempCoefficientPercentPerKelvin', num)} />
          </Field>
          <Field id="ratedLifeHours" label="Rated life" required error={e.ratedLifeHours?.message}>
            <UnitInput id="ratedLifeHours" unit="h" inputMode="numeric" invalid={!!e.ratedLifeHours} {...register('ratedLifeHours', num)} />
          </Field>
          <Field id="ratedLifeCelsius" label="at rated temperature" required error={e.ratedLifeCelsius?.message}>
            <UnitInput id="ratedLifeCelsius" unit="°C" invalid={!!e.ratedLifeCelsius} {...register('ratedLifeCelsius', num)} />
          </Field>
        </div>
      </fieldset>

      <fieldset className="space-y-4">
        <legend className="mb-2 text-sm font-bold uppercase tracking-wide text-tide-600">Limits and interval</legend>
        <div className="grid gap-4 sm:grid-cols-3">
          <Field id="watchRatio" label="Watch below" required hint="Capacitance / baseline, e.g. 0.90" error={e.watchRatio?.message}>
            <TextInput id="watchRatio" inputMode="decimal" invalid={!!e.watchRatio} {...register('watchRatio', num)} />
          </Field>
          <Field id="endOfLifeRatio" label="End of life below" required hint="e.g. 0.80" error={e.endOfLifeRatio?.message}>
            <TextInput id="endOfLifeRatio" inputMode="decimal" invalid={!!e.endOfLifeRatio} {...register('endOfLifeRatio', num)} />
          </Field>
          <Field id="inspectionIntervalDays" label="Inspect every" required error={e.inspectionIntervalDays?.message}>
            <UnitInput id="inspectionIntervalDays" unit="days" inputMode="numeric" invalid={!!e.inspectionIntervalDays} {...register('inspectionIntervalDays', num)} />
          </Field>
        </div>
      </fieldset>

      <Field id="notes" label="Notes" error={e.notes?.message}>
        <TextArea id="notes" invalid={!!e.notes} {...register('notes')} />
      </Field>
      {design ? (
        <Field
          id="changeNote"
          label="Why the change"
          hint={`A change to the nameplate, limits or interval makes revision ${design.revision + 1}; verdicts already made keep revision ${design.revision}.`}
          error={e.changeNote?.message}
        >
          <TextInput id="changeNote" invalid={!!e.changeNote} {...register('changeNote')} />
        </Field>
      ) : null}
      <SaveProblem error={mutation.error} fields={FIELDS} what="bank design" onReload={reload} />
      <FormActions saving={mutation.isPending} saveLabel={design ? 'Save changes' : 'Add bank design'} onCancel={onCancel} />
    </form>
  );
}
