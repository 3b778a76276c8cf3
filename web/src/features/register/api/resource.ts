/**
 * One query-key and query-option factory per register resource (general to specific: all,
 * lists, list(params), details, detail(id), audit(id)), with its fetchers and hooks. Every
 * fetcher throws ApiError on a non-2xx answer.
 */
import { keepPreviousData, queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import type { AuditEntry } from '../../../../../shared/schemas/audit';
import type { ListPage } from '../../../../../shared/schemas/common';
import { apiFetch } from '../../../lib/api-client';

/** What a list asks for: `?page&pageSize&sort&q` and the resource's filters. */
export type ListParams = {
  page: number;
  pageSize: number;
  sort: string;
  q?: string;
} & Record<string, string | number | boolean | undefined>;

/** The query string of a list, leaving out empty values. */
export function toQueryString(params: Record<string, string | number | boolean | undefined>): string {
  const search = new URLSearchParams();
  for (const [key, value] of Object.entries(params)) {
    if (value === undefined || value === '' || value === false) continue;
    search.set(key, String(value));
  }
  return search.toString();
}

export function createResourceApi<T extends { id: string; version: number }, TDetail extends T = T, TInput = unknown, TUpdate = unknown>(
  name: string,
  basePath: string,
) {
  const keys = {
    all: [name] as const,
    lists: () => [...keys.all, 'list'] as const,
    list: (params: ListParams) => [...keys.lists(), params] as const,
    details: () => [...keys.all, 'detail'] as const,
    detail: (id: string) => [...keys.details(), id] as const,
    audit: (id: string) => [...keys.detail(id), 'audit'] as const,
  };

  const list = (params: ListParams) => apiFetch<ListPage<T>>(`${basePath}?${toQueryString(params)}`);
  const get = (id: string) => apiFetch<TDetail>(`${basePath}/${id}`);
  const audit = async (id: string) => (await apiFetch<{ items: AuditEntry[] }>(`${basePath}/${id}/audit`)).items;
  const create = (input: TInput) => apiFetch<TDetail>(basePath, { method: 'POST', body: JSON.stringify(input) });
  const update = (id: string, change: TUpdate) =>
    apiFetch<TDetail>(`${basePath}/${id}`, { method: 'PATCH', body: JSON.stringify(change) });
  const retire = (id: string, version: number) =>
    apiFetch<TDetail>(`${basePath}/${id}?version=${version}`, { method: 'DELETE' });

  const listOptions = (params: ListParams) =>
    queryOptions({ queryKey: keys.list(params), queryFn: () => list(params), placeholderData: keepPreviousData });
  const detailOptions = (id: string) => queryOptions({ queryKey: keys.detail(id), queryFn: () => get(id) });
  const auditOptions = (id: string) => queryOptions({ queryKey: keys.audit(id), queryFn: () => audit(id) });

  /** After a write: the record's page, its audit trail and every list show the new state. */
  function useInvalidate() {
    const client = useQueryClient();
    return (id?: string) =>
      Promise.all([
        client.invalidateQueries({ queryKey: keys.lists() }),
        id ? client.invalidateQueries({ queryKey: keys.detail(id) }) : undefined,
      ]);
  }

  function useCreate() {
    const invalidate = useInvalidate();
    return useMutation({ mutationFn: create, onSuccess: () => invalidate() });
  }

  function useUpdate(id: string) {
    const invalidate = useInvalidate();
    return useMutation({ mutationFn: (change: TUpdate) => update(id, change), onSuccess: () => invalidate(id) });
  }

  /**
   * The save of a record's form: adds the record, or sends the change with the version it was
   * read at (a stale version is refused by the server); after such a conflict `reload` fetches
   * their version, takes its version number and hands it to `onReloaded` to refill the form.
   */
  function useVersionedSave(
    record: T | undefined,
    handlers: { onSaved: (saved: TDetail) => void; onError: (error: unknown) => void; onReloaded: (fresh: TDetail) => void },
  ) {
    const client = useQueryClient();
    const [version, setVersion] = useState(record?.version ?? 0);
    const creating = useCreate();
    const updating = useUpdate(record?.id ?? '');
    const mutation = record ? updating : creating;
    const callbacks = { onSuccess: handlers.onSaved, onError: handlers.onError };
    return {
      mutation,
      save(input: TInput, change: Omit<TUpdate, 'version'>) {
        // TUpdate is the change plus the version it was read at
        if (record) updating.mutate({ ...change, version } as TUpdate, callbacks);
        else creating.mutate(input, callbacks);
      },
      /** Sends the last save again, confirming the unlikely values the API asked about. */
      saveAnyway() {
        const sent = mutation.variables;
        if (!sent) return;
        if (record) updating.mutate({ ...(sent as TUpdate), confirmed: true }, callbacks);
        else creating.mutate({ ...(sent as TInput), confirmed: true }, callbacks);
      },
      async reload() {
        if (!record) return;
        const fresh = await client.fetchQuery({ ...detailOptions(record.id), staleTime: 0 });
        setVersion(fresh.version);
        handlers.onReloaded(fresh);
        mutation.reset();
      },
    };
  }

  return {
    keys,
    list,
    get,
    create,
    update,
    retire,
    listOptions,
    detailOptions,
    auditOptions,
    useInvalidate,
    useList: (params: ListParams, enabled = true) => useQuery({ ...listOptions(params), enabled }),
    useDetail: (id: string, enabled = true) => useQuery({ ...detailOptions(id), enabled: enabled && id !== '' }),
    useAudit: (id: string) => useQuery(auditOptions(id)),
    useCreate,
    useUpdate,
    useVersionedSave,
    useRetire(id: string) {
      const invalidate = useInvalidate();
      return useMutation({ mutationFn: (version: number) => retire(id, version), onSuccess: () => invalidate(id) });
    },
  };
}
