import { zodResolver } from '@hookform/resolvers/zod';
import { useQueryClient } from '@tanstack/react-query';
import { useEffect, useState } from 'react';
import { useForm, useWatch } from 'react-hook-form';
import type { z } from 'zod';
import { CABINET_STATUS_LABELS, CRITICALITIES, EDITABLE_CABINET_STATUSES } from '../../../../../shared/constants/register';
import { cabinetInputSchema, type Cabinet } from '../../../../../shared/schemas/cabinet';
import { Field, Select, TextArea, TextInput, UnitInput } from '../../../components/ui/field';
import { areasApi } from '../api/areas';
import { cabinetsApi } from '../api/cabinets';
import { sitesApi } from '../api/sites';
import { asDate, asNumber, FieldQuestion, FormActions, SaveProblem, showServerIssues, unlikelyQuestions } from './form-kit';

type Values = z.input<typeof cabinetInputSchema>;
const FIELDS = [
  'areaId',
  'tag',
  'location',
  'driveMake',
  'driveModel',
  'supplyVolts',
  'dcBusVolts',
  'ratedPowerKilowatts',
  'markedWaitMinutes',
  'criticality',
  'environmentNotes',
  'commissionedOn',
  'status',
] as const;

function valuesOf(c?: Cabinet, areaId?: string): Values {
  return {
    areaId: c?.areaId ?? areaId ?? '',
    tag: c?.tag ?? '',
    location: c?.location ?? '',
    driveMake: c?.driveMake ?? '',
    driveModel: c?.driveModel ?? '',
    supplyVolts: c?.supplyVolts ?? (null as unknown as number),
    dcBusVolts: c?.dcBusVolts ?? null,
    ratedPowerKilowatts: c?.ratedPowerKilowatts ?? null,
    markedWaitMinutes: c?.markedWaitMinutes ?? null,
    criticality: c?.criticality ?? 'medium',
    environmentNotes: c?.environmentNotes ?? '',
    commissionedOn: c?.commissionedOn ?? null,
    status: c && c.status !== 'retired' ? c.status : 'in-service',
  };
}

/** Adding a cabinet, or changing one (moving it to another area too). */
export function CabinetForm({
  cabinet,
  areaId,
  onSaved,
  onCancel,
}: {
  cabinet?: Cabinet;
  areaId?: string;
  onSaved: (c: Cabinet) => void;
  onCancel: () => void;
}) {
  const { register, handleSubmit, setError, reset, formState, control, setValue } = useForm<Values, unknown, z.output<typeof cabinetInputSchema>>({
    resolver: zodResolver(cabinetInputSchema),
    defaultValues: valuesOf(cabinet, areaId),
  });
  const client = useQueryClient();
  const [siteId, setSiteId] = useState(cabinet?.siteId ?? '');
  const sites = sitesApi.useList({ page: 1, pageSize: 100, sort: 'name' });
  const areas = areasApi.useList({ page: 1, pageSize: 100, sort: 'name', siteId }, siteId !== '');
  const { mutation, save, saveAnyway, reload } = cabinetsApi.useVersionedSave(cabinet, {
    onSaved,
    onError: (error) => showServerIssues(error, setError, FIELDS),
    onReloaded: (fresh) => {
      setSiteId(fresh.siteId);
      reset(valuesOf(fresh));
    },
  });

  // a new cabinet for a given area starts in that area's site
  useEffect(() => {
    if (cabinet || !areaId || siteId) return;
    void client.fetchQuery(areasApi.detailOptions(areaId)).then((a) => setSiteId(a.siteId));
  }, [areaId, cabinet, client, siteId]);

  const supply = useWatch({ control, name: 'supplyVolts' });
  const submit = handleSubmit((data) => save(data, data));
  const e = formState.errors;
  const questions = unlikelyQuestions(mutation.error);
  const ask = (id: 'dcBusVolts' | 'commissionedOn') => (
    <FieldQuestion id={id} question={questions[id]} saving={mutation.isPending} onSaveAnyway={saveAnyway} />
  );
  const num = { setValueAs: asNumber };
  return (
    <form onSubmit={submit} noValidate className="max-w-3xl space-y-6" aria-label={cabinet ? `Edit ${cabinet.tag}` : 'New cabinet'}>
      <fieldset className="space-y-4">
        <legend className="mb-2 text-sm font-bold uppercase tracking-wide text-tide-600">Where</legend>
        <div className="grid gap-4 sm:grid-cols-2">
          <Field id="siteId" label="Site" required>
            <Select
              id="siteId"
              value={siteId}
              onChange={(ev) => {
                setSiteId(ev.target.value);
                setValue('areaId', '');
              }}
            >
              <option value="">Choose a site…</option>
              {sites.data?.items.map((s) => (
                <option key={s.id} value={s.id}>
                  {s.name}
                </option>
              ))}
            </Select>
          </Field>
          <Field id="areaId" label="Area" required error={e.areaId?.message}>
            <Select id="areaId" key={`areas-${siteId}-${areas.data ? 'loaded' : 'loading'}`} invalid={!!e.areaId} disabled={!siteId} {...register('areaId')}>
              <option value="">{siteId ? 'Choose an area…' : 'Choose the site first'}</option>
              {areas.data?.items.map((a) => (
                <option key={a.id} value={a.id}>
                  {a.name}
                </option>
              ))}
            </Select>
          </Field>
          <Field id="tag" label="Tag" required hint="As written on the cabinet, e.g. BRK-M2-VFD-014" error={e.tag?.message}>
            <TextInput id="tag" invalid={!!e.tag} className="font-mono uppercase" autoCapitalize="characters" {...register('tag')} />
          </Field>
          <Field id="location" label="Location" hint="Where it stands, e.g. mezzanine, bay 4" error={e.location?.message}>
            <TextInput id="location" invalid={!!e.location} {...register('location')} />
          </Field>
        </div>
      </fieldset>

      <fieldset className="space-y-4">
        <legend className="mb-2 text-sm font-bold uppercase tracking-wide text-tide-600">Drive</legend>
        <div className="grid gap-4 sm:grid-cols-2">
          <Field id="driveMake" label="Drive make" error={e.driveMake?.message}>
            <TextInput id="driveMake" invalid={!!e.driveMake} {...register('driveMake')} />
          </Field>
          <Field id="driveModel" label="Drive model" error={e.driveModel?.message}>
            <TextInput id="driveModel" invalid={!!e.driveModel} {...register('driveModel')} />
          </Field>
          <Field id="supplyVolts" label="Supply voltage (AC line)" required error={e.supplyVolts?.message}>
            <UnitInput id="supplyVolts" unit="V" invalid={!!e.supplyVolts} {...register('supplyVolts', num)} />
          </Field>
          <Field
            id="dcBusVolts"
            label="Nominal DC-bus voltage"
            hint={typeof supply === 'number' && supply > 0 ? `About ${Math.round(supply * 1.35)}–${Math.round(supply * 1.41)} V for ${supply} V AC` : 'About 1.35 × the line voltage'}
            error={e.dcBusVolts?.message}
          >
            <UnitInput id="dcBusVolts" unit="V" invalid={!!e.dcBusVolts} {...register('dcBusVolts', num)} />
            {ask('dcBusVolts')}
          </Field>
          <Field id="ratedPowerKilowatts" label="Rated power" error={e.ratedPowerKilowatts?.message}>
            <UnitInput id="ratedPowerKilowatts" unit="kW" invalid={!!e.ratedPowerKilowatts} {...register('ratedPowerKilowatts', num)} />
          </Field>
          <Field
            id="markedWaitMinutes"
            label="Marked discharge wait time"
            hint="The drive maker's wait before opening, as marked on the drive"
            error={e.markedWaitMinutes?.message}
          >
            <UnitInput id="markedWaitMinutes" unit="min" inputMode="numeric" invalid={!!e.markedWaitMinutes} {...register('markedWaitMinutes', num)} />
          </Field>
        </div>
      </fieldset>

      <fieldset className="space-y-4">
        <legend className="mb-2 text-sm font-bold uppercase tracking-wide text-tide-600">Service</legend>
        <div className="grid gap-4 sm:grid-cols-3">
          <Field id="criticality" label="Criticality" error={e.criticality?.message}>
            <Select id="criticality" invalid={!!e.criticality} {...register('criticality')}>
              {CRITICALITIES.map((c) => (
                <option key={c} value={c}>
                  {c}
                </option>
              ))}
            </Select>
          </Field>
          <Field id="status" label="Status" error={e.status?.message}>
            <Select id="status" invalid={!!e.status} {...register('status')}>
              {EDITABLE_CABINET_STATUSES.map((s) => (
                <option key={s} value={s}>
                  {CABINET_STATUS_LABELS[s]}
                </option>
              ))}
            </Select>
          </Field>
          <Field id="commissionedOn" label="Commissioned on" error={e.commissionedOn?.message}>
            <TextInput id="commissionedOn" type="date" invalid={!!e.commissionedOn} {...register('commissionedOn', { setValueAs: asDate })} />
            {ask('commissionedOn')}
          </Field>
        </div>
        <Field id="environmentNotes" label="Environment" hint="Heat, dust, damp, vibration: what ages the capacitors here" error={e.environmentNotes?.message}>
          <TextArea id="environmentNotes" invalid={!!e.environmentNotes} {...register('environmentNotes')} />
        </Field>
      </fieldset>

      <SaveProblem error={mutation.error} fields={FIELDS} what="cabinet" onReload={reload} />
      <FormActions saving={mutation.isPending} saveLabel={cabinet ? 'Save changes' : 'Add cabinet'} onCancel={onCancel} />
    </form>
  );
}
