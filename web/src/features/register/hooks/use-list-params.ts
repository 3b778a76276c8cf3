import { useCallback, useMemo } from 'react';
import { useSearchParams } from 'react-router';
import type { ListParams } from '../api/resource';

/** Changes some of a list's parameters (an empty value removes one). */
export type ListUpdate = (change: Record<string, string | number | undefined>) => void;

/**
 * A list's page, size, sort, search and filters, kept in the address bar so a list can be
 * shared, bookmarked and come back with the browser's Back button.
 */
export function useListParams(defaults: { sort: string; pageSize?: number }, filterNames: readonly string[] = []) {
  const [search, setSearch] = useSearchParams();
  const filterKey = filterNames.join(',');
  const params = useMemo<ListParams>(() => {
    const out: ListParams = {
      page: Math.max(1, Number(search.get('page')) || 1),
      pageSize: Number(search.get('pageSize')) || defaults.pageSize || 25,
      sort: search.get('sort') || defaults.sort,
      q: search.get('q') ?? '',
    };
    for (const name of filterKey.split(',').filter(Boolean)) {
      const value = search.get(name);
      if (value) out[name] = value;
    }
    return out;
  }, [search, defaults.sort, defaults.pageSize, filterKey]);

  /** Changes some parameters; any change other than the page starts again at page 1. */
  const update = useCallback<ListUpdate>(
    (change) => {
      setSearch(
        (now) => {
          const next = new URLSearchParams(now);
          for (const [key, value] of Object.entries(change)) {
            if (value === undefined || value === '') next.delete(key);
            else next.set(key, String(value));
          }
          if (!('page' in change)) next.delete('page');
          return next;
        },
        { replace: true },
      );
    },
    [setSearch],
  );
  return [params, update] as const;
}
