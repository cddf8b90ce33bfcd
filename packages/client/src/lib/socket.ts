import { io, type Socket } from 'socket.io-client';
import type { ClientToServerEvents, ServerToClientEvents } from '@burrowline/shared';

export type RealtimeSocket = Socket<ServerToClientEvents, ClientToServerEvents>;

let socket: RealtimeSocket | null = null;

/** One connection per tab, opened only while someone is signed in (the session cookie authenticates it). */
export function connectRealtime(): RealtimeSocket {
  socket ??= io({ path: '/socket.io', withCredentials: true, autoConnect: false });
  if (!socket.connected) socket.connect();
  return socket;
}

export function disconnectRealtime(): void {
  socket?.disconnect();
  socket = null;
}
