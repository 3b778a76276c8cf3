import { useCallback, useMemo } from 'react';
import { useSearchParams } from 'react-router';
import { DUE_BUCKETS, type DueBucket } from '../../../../../shared/domain/due';
import type { DueListParams } from '../api/get-due-list';

/** The filters the Due list keeps in the address bar, besides bucket, page, size and sort. */
export const DUE_FILTERS = [
  'siteId',
  'areaId',
  'bankDesignId',
  'criticality',
  'health',
  'planned',
  'q',
] as const;

/** The tab a Due list opens on. */
export const DEFAULT_DUE_BUCKET: DueBucket = 'overdue';

/** Changes some of the list's parameters (an empty value removes one). */
export type DueParamsUpdate = (change: Record<string, string | number | undefined>) => void;

/**
 * The Due list's tab, filters, sort and page from the address bar, so a list can be shared,
 * bookmarked and come back with Back; and the way to change them (any change but the page
 * starts again at page 1; a new site forgets the area).
 */
export function useDueParams() {
  const [search, setSearch] = useSearchParams();
  const params = useMemo(() => {
    const bucketParam = search.get('bucket');
    const bucket: DueBucket = DUE_BUCKETS.includes(bucketParam as DueBucket)
      ? (bucketParam as DueBucket)
      : DEFAULT_DUE_BUCKET;
    const out: DueListParams & { bucket: DueBucket; page: number; pageSize: number; sort: string } =
      {
        bucket,
        page: Math.max(1, Number(search.get('page')) || 1),
        pageSize: Math.min(100, Number(search.get('pageSize')) || 25),
        sort: search.get('sort') || 'dueOn',
      };
    for (const name of DUE_FILTERS) {
      const value = search.get(name);
      if (value) out[name] = value;
    }
    return out;
  }, [search]);

  const update = useCallback<DueParamsUpdate>(
    (change) => {
      setSearch(
        (now) => {
          const next = new URLSearchParams(now);
          for (const [key, value] of Object.entries(change)) {
            if (value === undefined || value === '') next.delete(key);
            else next.set(key, String(value));
          }
          if ('siteId' in change && !('areaId' in change)) next.delete('areaId');
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
