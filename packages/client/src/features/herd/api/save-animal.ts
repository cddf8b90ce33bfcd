import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { AnimalCreateBody, AnimalDetailDto, AnimalUpdateBody } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { herdKeys } from './herd-keys';

export function createAnimal(body: AnimalCreateBody): Promise<AnimalDetailDto> {
  return apiFetch<AnimalDetailDto>('/api/animals', { method: 'POST', body });
}

export function updateAnimal(animalId: string, body: AnimalUpdateBody): Promise<AnimalDetailDto> {
  return apiFetch<AnimalDetailDto>(`/api/animals/${encodeURIComponent(animalId)}`, { method: 'PATCH', body });
}

/** Adds or edits an animal; a 422 `confirmation_required` comes back as an error the form turns into "Save anyway". */
export function useSaveAnimal(animalId: string | null) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: AnimalCreateBody | AnimalUpdateBody) =>
      animalId ? updateAnimal(animalId, body as AnimalUpdateBody) : createAnimal(body as AnimalCreateBody),
    onSuccess: async (animal) => {
      queryClient.setQueryData(herdKeys.detail(animal.id), { kind: 'record', animal });
      // Parents, offspring, COI and make-up of others may have moved: refresh the rest of the Herd.
      await queryClient.invalidateQueries({ queryKey: herdKeys.all, predicate: (q) => q.queryKey[3] !== animal.id });
    },
  });
}
