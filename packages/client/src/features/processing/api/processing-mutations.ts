import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ProcessingMarkCreateBody, ProcessingMarkDto, ProcessingRecordCreateBody, ProcessingRecordDto } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { growOutKeys } from '../../grow-out';
import { herdKeys } from '../../herd';
import { performanceKeys } from '../../performance';
import { processingKeys } from './keys';

export function recordProcessing(input: ProcessingRecordCreateBody): Promise<ProcessingRecordDto> {
  return apiFetch<ProcessingRecordDto>('/api/processing-records', { method: 'POST', body: input });
}

export function markForProcessing(input: ProcessingMarkCreateBody): Promise<ProcessingMarkDto> {
  return apiFetch<ProcessingMarkDto>('/api/processing-marks', { method: 'POST', body: input });
}

export function cancelMark({ id, version }: { id: string; version: number }): Promise<ProcessingMarkDto> {
  return apiFetch<ProcessingMarkDto>(`/api/processing-marks/${id}/cancellation`, { method: 'POST', body: { version } });
}

function useInvalidate() {
  const queryClient = useQueryClient();
  return async () => {
    await Promise.all([
      queryClient.invalidateQueries({ queryKey: processingKeys.all }),
      // A processed animal leaves the Herd; a batch changes the group's heads left; the performance tables read yields.
      queryClient.invalidateQueries({ queryKey: herdKeys.all }),
      queryClient.invalidateQueries({ queryKey: growOutKeys.all }),
      queryClient.invalidateQueries({ queryKey: performanceKeys.all }),
    ]);
  };
}

/** A processing record: refused (400, field messages) for a withdrawal, more heads than are left, impossible weights. */
export function useRecordProcessing() {
  const invalidate = useInvalidate();
  return useMutation({ mutationFn: recordProcessing, onSuccess: invalidate });
}

export function useMarkForProcessing() {
  const invalidate = useInvalidate();
  return useMutation({ mutationFn: markForProcessing, onSuccess: invalidate });
}

export function useCancelMark() {
  const invalidate = useInvalidate();
  return useMutation({ mutationFn: cancelMark, onSuccess: invalidate });
}
