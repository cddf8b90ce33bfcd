import { useMutation, useQueryClient } from '@tanstack/react-query';
import { useNavigate } from 'react-router-dom';
import { apiFetch } from '../../../lib/api-client';
import { leaveSignedInArea } from '../leave-signed-in-area';

export function signOut(): Promise<void> {
  return apiFetch<void>('/api/session', { method: 'DELETE' });
}

export function useSignOut() {
  const queryClient = useQueryClient();
  const navigate = useNavigate();
  return useMutation({
    mutationFn: signOut,
    onSuccess: () => leaveSignedInArea(queryClient, navigate, { notice: 'signed-out' }),
  });
}
