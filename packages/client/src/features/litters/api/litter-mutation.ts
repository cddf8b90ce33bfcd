import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { LitterDto } from '@burrowline/shared';
import { almanacKeys } from '../../almanac';
import { litterKeys } from './litter-keys';

/** Every change to a litter answers with the litter as it is now; its tasks live in the Almanac too. */
export function useLitterMutation<V>(request: (variables: V) => Promise<LitterDto>) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: request,
    onSuccess: async (litter) => {
      queryClient.setQueryData(litterKeys.detail(litter.id), litter);
      await queryClient.invalidateQueries({ queryKey: litterKeys.all });
      await queryClient.invalidateQueries({ queryKey: almanacKeys.all });
    },
  });
}
