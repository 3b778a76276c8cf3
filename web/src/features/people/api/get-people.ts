import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { Person } from '../../../../../shared/schemas/person';
import { apiFetch } from '../../../lib/api-client';

export interface PeopleFilters {
  q: string;
}

/** Everyone (admins), or the matches of a search in name or e-mail. */
export async function getPeople({ q }: PeopleFilters): Promise<Person[]> {
  const query = q.trim() ? `?${new URLSearchParams({ q: q.trim() })}` : '';
  return (await apiFetch<{ items: Person[] }>(`/api/people${query}`)).items;
}

export const peopleKeys = {
  all: ['people'] as const,
  lists: () => [...peopleKeys.all, 'list'] as const,
  list: (filters: PeopleFilters) => [...peopleKeys.lists(), filters] as const,
};

export const peopleQueryOptions = (filters: PeopleFilters) =>
  queryOptions({
    queryKey: peopleKeys.list(filters),
    queryFn: () => getPeople(filters),
    placeholderData: keepPreviousData,
  });

export const usePeople = (filters: PeopleFilters) => useQuery(peopleQueryOptions(filters));
