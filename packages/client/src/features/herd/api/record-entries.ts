import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { AnimalDetailDto, AnimalNoteCreateInput, AnimalNoteDto, StatusEventInput } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { herdKeys } from './herd-keys';

export function recordStatus(animalId: string, body: StatusEventInput): Promise<AnimalDetailDto> {
  return apiFetch<AnimalDetailDto>(`/api/animals/${encodeURIComponent(animalId)}/status-events`, { method: 'POST', body });
}

export function addAnimalNote(animalId: string, body: AnimalNoteCreateInput): Promise<AnimalNoteDto> {
  return apiFetch<AnimalNoteDto>(`/api/animals/${encodeURIComponent(animalId)}/notes`, { method: 'POST', body });
}

export function useRecordStatus(animalId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: StatusEventInput) => recordStatus(animalId, body),
    onSuccess: async (animal) => {
      queryClient.setQueryData(herdKeys.detail(animalId), { kind: 'record', animal });
      await queryClient.invalidateQueries({ queryKey: [...herdKeys.all, 'animals', 'list'] });
    },
  });
}

export function useAddAnimalNote(animalId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: AnimalNoteCreateInput) => addAnimalNote(animalId, body),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: herdKeys.detail(animalId) }),
  });
}
