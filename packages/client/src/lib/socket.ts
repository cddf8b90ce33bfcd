import { io, type Socket } from 'socket.io-client';
import type { ClientToServerEvents, ServerToClientEvents } from '@burrowline/shared';

export type RealtimeSocket = Socket<ServerToClientEvents, ClientToServerEvents>;

let socket: RealtimeSocket | null = null;

/**
 * One connection per tab, opened only while someone is signed in (the session cookie authenticates it).
 * WebSocket from the start: with several app instances behind a load balancer, long-polling's requests of one
 * connection would have to reach the same instance (sticky sessions); one WebSocket stays on one by itself.
 */
export function connectRealtime(): RealtimeSocket {
  socket ??= io({ path: '/socket.io', withCredentials: true, autoConnect: false, transports: ['websocket'] });
  if (!socket.connected) socket.connect();
  return socket;
}

export function disconnectRealtime(): void {
  socket?.disconnect();
  socket = null;
}
