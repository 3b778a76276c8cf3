import { queryOptions, useQuery } from '@tanstack/react-query';
import type { AdminContact } from '../../../../../shared/schemas/me';
import { apiFetch } from '../../../lib/api-client';

/** The active admins, whom a person without a role can ask for access. */
export async function getAdmins(): Promise<AdminContact[]> {
  return (await apiFetch<{ items: AdminContact[] }>('/api/people/admins')).items;
}

export const adminKeys = { all: ['admins'] as const };

export const adminsQueryOptions = () =>
  queryOptions({ queryKey: adminKeys.all, queryFn: getAdmins });

export const useAdmins = () => useQuery(adminsQueryOptions());
