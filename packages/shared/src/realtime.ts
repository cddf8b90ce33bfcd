/** Socket.IO event names and payloads; the client maps each to TanStack Query invalidations. */
export const RealtimeEvent = {
  farmUpdated: 'farm:updated',
  sessionEnded: 'session:ended',
} as const;

export interface ServerToClientEvents {
  [RealtimeEvent.farmUpdated]: (payload: { farmId: string }) => void;
  [RealtimeEvent.sessionEnded]: (payload: { reason: string }) => void;
}

// eslint-disable-next-line @typescript-eslint/no-empty-object-type
export interface ClientToServerEvents {}

/** Room names: a socket joins only the rooms its ability allows. */
export const rooms = {
  coop: (coopId: string) => `coop:${coopId}`,
  coopAdmins: (coopId: string) => `coop:${coopId}:admins`,
  farm: (farmId: string) => `farm:${farmId}`,
  user: (userId: string) => `user:${userId}`,
};
