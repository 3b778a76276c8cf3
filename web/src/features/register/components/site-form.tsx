import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import { siteInputSchema, type Site } from '../../../../../shared/schemas/site';
import { Field, TextArea, TextInput } from '../../../components/ui/field';
import { sitesApi } from '../api/sites';
import { FormActions, SaveProblem, showServerIssues } from './form-kit';

type Values = z.input<typeof siteInputSchema>;
const FIELDS = ['name', 'code', 'address', 'timeZone'] as const;

function valuesOf(site?: Site): Values {
  return {
    name: site?.name ?? '',
    code: site?.code ?? '',
    address: site?.address ?? '',
    timeZone: site?.timeZone ?? Intl.DateTimeFormat().resolvedOptions().timeZone ?? 'UTC',
  };
}

/** Adding a site, or changing one (sent with the version it was read at). */
export function SiteForm({ site, onSaved, onCancel }: { site?: Site; onSaved: (site: Site) => void; onCancel: () => void }) {
  const { register, handleSubmit, setError, reset, formState } = useForm<Values, unknown, z.output<typeof siteInputSchema>>({
    resolver: zodResolver(siteInputSchema),
    defaultValues: valuesOf(site),
  });
  const { mutation, save, reload } = sitesApi.useVersionedSave(site, {
    onSaved,
    onError: (error) => showServerIssues(error, setError, FIELDS),
    onReloaded: (fresh) => {
      reset(valuesOf(fresh));
    },
  });

  const submit = handleSubmit((data) => save(data, data));
  const e = formState.errors;
  return (
    <form onSubmit={submit} noValidate className="max-w-2xl space-y-4" aria-label={site ? `Edit ${site.name}` : 'New site'}>
      <div className="grid gap-4 sm:grid-cols-[1fr_10rem]">
        <Field id="name" label="Name" required error={e.name?.message}>
          <TextInput id="name" invalid={!!e.name} {...register('name')} />
        </Field>
        <Field id="code" label="Code" required hint="Used in tags, e.g. M" error={e.code?.message}>
          <TextInput id="code" invalid={!!e.code} autoCapitalize="characters" className="font-mono uppercase" {...register('code')} />
        </Field>
      </div>
      <Field id="address" label="Address" error={e.address?.message}>
        <TextArea id="address" invalid={!!e.address} {...register('address')} />
      </Field>
      <Field id="timeZone" label="Time zone" required hint="IANA name, e.g. Europe/London; visit times show in it" error={e.timeZone?.message}>
        <TextInput id="timeZone" invalid={!!e.timeZone} list="time-zones" {...register('timeZone')} />
      </Field>
      <datalist id="time-zones">
        {(Intl.supportedValuesOf?.('timeZone') ?? []).map((tz) => (
          <option key={tz} value={tz} />
        ))}
      </datalist>
      <SaveProblem error={mutation.error} fields={FIELDS} what="site" onReload={reload} />
      <FormActions saving={mutation.isPending} saveLabel={site ? 'Save changes' : 'Add site'} onCancel={onCancel} />
    </form>
  );
}
