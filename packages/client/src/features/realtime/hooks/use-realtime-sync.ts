import { useQueryClient } from '@tanstack/react-query';
import { useEffect } from 'react';
import { useNavigate } from 'react-router-dom';
import { RealtimeEvent } from '@burrowline/shared';
import { leaveSignedInArea } from '../../auth/leave-signed-in-area';
import { farmKeys } from '../../farms/api/farm-keys';

/**
 * The one place where server events become cache updates. Mounted by the signed-in layout, so the
 * socket exists exactly while someone is signed in.
 */
export function useRealtimeSync(): void {
  const queryClient = useQueryClient();
  const navigate = useNavigate();

  useEffect(() => {
    let unmounted = false;
    let stop = () => {};

    // Socket.IO loads after the first paint; the signed-out screens never download it.
    void import('../../../lib/socket').then(({ connectRealtime, disconnectRealtime }) => {
      if (unmounted) return;
      const socket = connectRealtime();
      const refreshFarms = () => void queryClient.invalidateQueries({ queryKey: farmKeys.all });
      const endSession = ({ reason }: { reason: string }) =>
        void leaveSignedInArea(
          queryClient,
          navigate,
          reason === 'signed_out' ? { notice: 'signed-out' } : { notice: 'session-ended', reason },
        );

      socket.on(RealtimeEvent.farmUpdated, refreshFarms);
      socket.on(RealtimeEvent.sessionEnded, endSession);
      // Events sent while the connection was down are lost; refetch what they would have refreshed.
      socket.io.on('reconnect', refreshFarms);
      stop = () => {
        socket.off(RealtimeEvent.farmUpdated, refreshFarms);
        socket.off(RealtimeEvent.sessionEnded, endSession);
        socket.io.off('reconnect', refreshFarms);
        disconnectRealtime();
      };
    });

    return () => {
      unmounted = true;
      stop();
    };
  }, [queryClient, navigate]);
}
