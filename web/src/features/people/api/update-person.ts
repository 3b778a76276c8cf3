import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Person, PersonUpdate } from '../../../../../shared/schemas/person';
import { apiFetch } from '../../../lib/api-client';
import { accessEventKeys } from './get-access-events';
import { peopleKeys } from './get-people';

/** An admin changes a person's roles or (de)activates them. */
export async function updatePerson(userId: string, change: PersonUpdate): Promise<Person> {
  return apiFetch<Person>(`/api/people/${userId}`, {
    method: 'PATCH',
    body: JSON.stringify(change),
  });
}

export function useUpdatePerson() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: ({ userId, change }: { userId: string; change: PersonUpdate }) =>
      updatePerson(userId, change),
    onSuccess: async () => {
      await Promise.all([
        client.invalidateQueries({ queryKey: peopleKeys.all }),
        client.invalidateQueries({ queryKey: accessEventKeys.all }),
      ]);
    },
  });
}
