import type { UseQueryResult } from '@tanstack/react-query';
import type { ListPage } from '../../../../../shared/schemas/common';
import { DataTable, type DataTableProps } from '../../../components/ui/data-table';
import { ErrorPanel } from '../../../components/ui/error-panel';
import { SearchInput } from '../../../components/ui/search-input';
import { Spinner } from '../../../components/ui/spinner';
import type { ListParams } from '../api/resource';
import { sitesApi } from '../api/sites';
import type { ListUpdate } from '../hooks/use-list-params';
import { FilterSelect } from '../../../components/ui/filter-select';
import { RetiredToggle } from './record-parts';

/** A list's parameters from the address bar and the way to change them (see useListParams). */
interface ListBinding {
  params: ListParams;
  update: ListUpdate;
}

/** The list's search box, bound to `q`. */
export function ListSearch({ params, update, label, placeholder }: ListBinding & { label: string; placeholder: string }) {
  return <SearchInput label={label} placeholder={placeholder} value={params.q ?? ''} onSearch={(q) => update({ q })} />;
}

/** A filter select bound to the parameter `name`; its first choice, `allLabel`, leaves it out. */
export function ParamSelect({
  params,
  update,
  name,
  label,
  allLabel,
  options,
}: ListBinding & { name: string; label: string; allLabel: string; options: Array<{ value: string; label: string }> }) {
  return (
    <FilterSelect
      label={label}
      value={String(params[name] ?? '')}
      onChange={(value) => update({ [name]: value })}
      options={[{ value: '', label: allLabel }, ...options]}
    />
  );
}

/** The "Site" filter (`siteId`), offering the first hundred sites by name. */
export function SiteFilter(binding: ListBinding) {
  const sites = sitesApi.useList({ page: 1, pageSize: 100, sort: 'name' });
  return (
    <ParamSelect
      {...binding}
      name="siteId"
      label="Site"
      allLabel="All sites"
      options={(sites.data?.items ?? []).map((s) => ({ value: s.id, label: s.name }))}
    />
  );
}

/** A checkbox bound to the flag parameter `name` ("true" when ticked, left out otherwise). */
export function FlagToggle({ params, update, name, label }: ListBinding & { name: string; label?: string }) {
  return <RetiredToggle label={label} checked={params[name] === 'true'} onChange={(v) => update({ [name]: v ? 'true' : undefined })} />;
}

/**
 * A register list's page: a spinner while the first page loads, the failure if it cannot, else
 * the table, paged and sorted through the address bar. `caption` also names the list in the
 * loading and failure messages.
 */
export function ListResults<T>({
  query,
  params,
  update,
  pageSizeChoice = true,
  ...table
}: ListBinding &
  Omit<DataTableProps<T>, 'rows' | 'total' | 'page' | 'pageSize' | 'sort' | 'onSortChange' | 'onPageChange' | 'onPageSizeChange' | 'loading'> & {
    query: UseQueryResult<ListPage<T>>;
    /** False hides the page-size choice (short lists embedded in a record's page). */
    pageSizeChoice?: boolean;
  }) {
  if (query.isPending) return <Spinner label={`Loading ${table.caption.toLowerCase()}…`} />;
  if (query.isError) return <ErrorPanel title={`${table.caption} could not be loaded`}>{query.error.message}</ErrorPanel>;
  return (
    <DataTable
      {...table}
      rows={query.data.items}
      total={query.data.total}
      page={params.page}
      pageSize={params.pageSize}
      sort={params.sort}
      onSortChange={(sort) => update({ sort })}
      onPageChange={(page) => update({ page })}
      onPageSizeChange={pageSizeChoice ? (pageSize) => update({ pageSize }) : undefined}
      loading={query.isFetching}
    />
  );
}
