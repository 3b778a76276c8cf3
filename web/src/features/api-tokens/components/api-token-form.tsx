import { zodResolver } from '@hookform/resolvers/zod';
import { Controller, useForm } from 'react-hook-form';
import { ROLE_LABELS, type Role } from '../../../../../shared/constants/roles';
import {
  API_TOKEN_EXPIRY_DAYS,
  apiTokenInputSchema,
  type ApiTokenData,
  type ApiTokenInput,
  type IssuedApiToken,
} from '../../../../../shared/schemas/api-token';
import { ApiError } from '../../../lib/api-client';
import { useCreateApiToken } from '../api/create-api-token';

const EXPIRY_LABELS: Record<number, string> = {
  7: '7 days',
  30: '30 days',
  90: '90 days',
  365: '1 year',
};

/** Makes a named token with an expiry, optionally narrowed to some of the person's roles. */
export function ApiTokenForm({
  myRoles,
  onIssued,
}: {
  myRoles: readonly Role[];
  onIssued: (token: IssuedApiToken) => void;
}) {
  const create = useCreateApiToken();
  const form = useForm<ApiTokenInput, unknown, ApiTokenData>({
    resolver: zodResolver(apiTokenInputSchema),
    defaultValues: { name: '', expiresInDays: 90, roles: null },
  });
  const { errors } = form.formState;

  const submit = form.handleSubmit((input) =>
    create.mutate(input, {
      onSuccess: (issued) => {
        form.reset();
        onIssued(issued);
      },
      onError: (error) => {
        if (error instanceof ApiError) {
          for (const issue of error.issues) {
            const field = issue.path.split('.')[0] as keyof ApiTokenInput;
            if (field === 'name' || field === 'expiresInDays' || field === 'roles')
              form.setError(field, { message: issue.message });
          }
        }
      },
    }),
  );

  return (
    <form onSubmit={submit} className="space-y-4" aria-label="New API token" noValidate>
      <div className="grid gap-4 sm:grid-cols-[minmax(0,2fr)_minmax(0,1fr)]">
        <div>
          <label htmlFor="token-name" className="mb-1 block text-sm font-medium text-tide-900">
            Name
          </label>
          <input
            id="token-name"
            {...form.register('name')}
            placeholder="e.g. Logger gateway, Mill 2"
            aria-invalid={errors.name ? true : undefined}
            aria-describedby={errors.name ? 'token-name-error' : undefined}
            className="w-full rounded-lg border border-tide-200 px-3 py-2 text-sm shadow-sm focus:border-tide-600 focus:outline-none focus:ring-2 focus:ring-spark-400/60 aria-[invalid=true]:border-eol-600"
          />
          {errors.name ? (
            <p id="token-name-error" className="mt-1 text-sm text-eol-600">
              {errors.name.message}
            </p>
          ) : null}
        </div>
        <div>
          <label htmlFor="token-expiry" className="mb-1 block text-sm font-medium text-tide-900">
            Expires after
          </label>
          <select
            id="token-expiry"
            {...form.register('expiresInDays', { valueAsNumber: true })}
            className="w-full rounded-lg border border-tide-200 bg-white px-3 py-2 text-sm shadow-sm"
          >
            {API_TOKEN_EXPIRY_DAYS.map((d) => (
              <option key={d} value={d}>
                {EXPIRY_LABELS[d] ?? `${d} days`}
              </option>
            ))}
          </select>
          {errors.expiresInDays ? (
            <p className="mt-1 text-sm text-eol-600">{errors.expiresInDays.message}</p>
          ) : null}
        </div>
      </div>
      {myRoles.length > 1 ? (
        <Controller
          control={form.control}
          name="roles"
          render={({ field }) => (
            <fieldset>
              <legend className="mb-1 text-sm font-medium text-tide-900">Acts with</legend>
              <div className="flex flex-wrap gap-2">
                <label className="flex items-center gap-2 rounded-lg border border-tide-100 bg-white px-3 py-2 text-sm">
                  <input
                    type="radio"
                    className="accent-tide-600"
                    checked={field.value == null}
                    onChange={() => field.onChange(null)}
                  />
                  All my roles
                </label>
                {myRoles.map((role) => (
                  <label
                    key={role}
                    className="flex items-center gap-2 rounded-lg border border-tide-100 bg-white px-3 py-2 text-sm"
                  >
                    <input
                      type="checkbox"
                      className="accent-tide-600"
                      checked={field.value?.includes(role) ?? false}
                      onChange={(e) => {
                        const now = field.value ?? [];
                        const next = e.target.checked
                          ? [...now, role]
                          : now.filter((r) => r !== role);
                        field.onChange(next.length ? next : null);
                      }}
                    />
                    only {ROLE_LABELS[role]}
                  </label>
                ))}
              </div>
              {errors.roles ? (
                <p className="mt-1 text-sm text-eol-600">{errors.roles.message}</p>
              ) : null}
            </fieldset>
          )}
        />
      ) : null}
      {create.isError && !(create.error instanceof ApiError && create.error.issues.length) ? (
        <p role="alert" className="text-sm font-medium text-eol-600">
          {create.error.message}
        </p>
      ) : null}
      <button
        type="submit"
        disabled={create.isPending}
        className="rounded-lg bg-spark-400 px-4 py-2 text-sm font-bold text-tide-950 hover:bg-spark-300 disabled:opacity-60"
      >
        {create.isPending ? 'Creating…' : 'Create token'}
      </button>
    </form>
  );
}
