import type { Server as HttpServer, IncomingMessage } from 'node:http';
import type { RequestHandler } from 'express';
import { Server, type Socket } from 'socket.io';
import { ZodError } from 'zod';
import { defineAbilityFor, ErrorCode, rooms, RealtimeEvent, subjectOf, type ClientToServerEvents, type ServerToClientEvents, type SocketAck } from '@burrowline/shared';
import { AppError } from './app-error';
import type { SessionUser } from './session-user';
import { logger } from './logger';
import { postgresAdapter } from './realtime-across-instances';

type RealtimeServer = Server<ClientToServerEvents, ServerToClientEvents>;
let io: RealtimeServer | null = null;

type HandshakeRequest = IncomingMessage & { user?: SessionUser; sessionID?: string; _query?: Record<string, string> };

/** Socket.IO's passport recipe: the session and passport run on the handshake request only. */
function onlyForHandshake(middleware: RequestHandler) {
  return (req: HandshakeRequest, res: unknown, next: (err?: unknown) => void) => {
    if (req._query?.sid === undefined) (middleware as unknown as (a: unknown, b: unknown, c: unknown) => void)(req, res, next);
    else next();
  };
}

export function roomsFor(user: SessionUser, sessionId: string): string[] {
  const ability = defineAbilityFor(user);
  const joined = [rooms.user(user.id), `session:${sessionId}`];
  if (ability.can('read', subjectOf('Coop', { id: user.coopId }))) joined.push(rooms.coop(user.coopId));
  if (user.farmId) joined.push(rooms.farm(user.farmId));
  if (user.farmId && ability.can('read', subjectOf('Money', { coopId: user.coopId, farmId: user.farmId }))) joined.push(rooms.farmLedger(user.farmId));
  if (ability.can('manage', subjectOf('Application', { coopId: user.coopId }))) joined.push(rooms.coopAdmins(user.coopId));
  return joined;
}

/** What a handler of a client's event may do with the socket that sent it. */
export interface ClientSocket {
  join(room: string): Promise<void> | void;
  leave(room: string): Promise<void> | void;
}

type ClientEventHandler = (user: SessionUser, payload: unknown, socket: ClientSocket) => Promise<void>;
const clientEventHandlers = new Map<keyof ClientToServerEvents, ClientEventHandler>();

/**
 * Handles a client's request over the socket like an HTTP request: the session is checked first (socket.use
 * below), the handler validates the payload and authorizes, and the client's ack gets `{ ok }` or the error body.
 */
export function onClientEvent(event: keyof ClientToServerEvents, handler: ClientEventHandler): void {
  clientEventHandlers.set(event, handler);
}

function refusalOf(error: unknown): SocketAck {
  if (error instanceof AppError) return { ok: false, error: { code: error.code, message: error.message } };
  if (error instanceof ZodError) return { ok: false, error: { code: ErrorCode.validation, message: error.issues[0]?.message ?? 'That request is not valid' } };
  logger.error('socket event failed', { error: String(error) });
  return { ok: false, error: { code: ErrorCode.internal, message: 'Something went wrong' } };
}

export interface RealtimeOptions {
  handshake: RequestHandler[];
  appUrl: string;
  isSessionCurrent: (sessionId: string) => Promise<boolean>;
  sessionCheckSeconds: number;
  /** Several app instances: carry every event to the others through this PostgreSQL database. */
  acrossInstances?: { connectionString: string } | null;
}

let sweeper: NodeJS.Timeout | null = null;
let closeAdapter: (() => Promise<void>) | null = null;

/** Attaches Socket.IO to the HTTP server, reusing the app's session and passport middleware. */
export function attachRealtime(httpServer: HttpServer, opts: RealtimeOptions): RealtimeServer {
  const allowedOrigin = new URL(opts.appUrl).origin;
  const server: RealtimeServer = new Server(httpServer, {
    path: '/socket.io',
    maxHttpBufferSize: 16 * 1024,
    serveClient: false,
    // A browser always sends Origin for a WebSocket; it must be ours.
    allowRequest: (req, callback) => {
      const origin = req.headers.origin;
      callback(null, !origin || origin === allowedOrigin);
    },
  });
  if (opts.acrossInstances) {
    const shared = postgresAdapter(opts.acrossInstances.connectionString);
    server.adapter(shared.adapter);
    closeAdapter = shared.close;
  }
  for (const middleware of opts.handshake) server.engine.use(onlyForHandshake(middleware));
  server.engine.use(
    onlyForHandshake(((req: HandshakeRequest, res: import('node:http').ServerResponse, next: () => void) => {
      if (req.user) return next();
      res.writeHead(401, { 'content-type': 'application/json' });
      res.end(JSON.stringify({ error: { code: 'unauthenticated', message: 'Sign in first' } }));
    }) as unknown as RequestHandler),
  );
  server.on('connection', (socket: Socket) => {
    const req = socket.request as HandshakeRequest;
    const user = req.user;
    if (!user || !req.sessionID) return socket.disconnect(true);
    socket.data.sessionId = req.sessionID;
    for (const room of roomsFor(user, req.sessionID)) void socket.join(room);
    // Every message a client sends is checked against a still-valid session first.
    socket.use((_packet, next) => {
      opts.isSessionCurrent(req.sessionID!).then((ok) => (ok ? next() : socket.disconnect(true)), () => socket.disconnect(true));
    });
    for (const [event, handler] of clientEventHandlers) {
      socket.on(event, (payload: unknown, ack: unknown) => {
        if (typeof ack !== 'function') return;
        const answer = ack as (result: SocketAck) => void;
        handler(user, payload, { join: (room) => socket.join(room), leave: (room) => socket.leave(room) }).then(
          () => answer({ ok: true }),
          (error: unknown) => answer(refusalOf(error)),
        );
      });
    }
    logger.debug('socket connected', { userId: user.id, coopId: user.coopId });
  });
  // Sessions also end silently (idle or absolute timeout): sweep open sockets and drop those.
  sweeper = setInterval(() => void dropEndedSessions(server, opts), opts.sessionCheckSeconds * 1000);
  sweeper.unref();
  io = server;
  return server;
}

export function publish<E extends keyof ServerToClientEvents>(room: string, event: E, ...payload: Parameters<ServerToClientEvents[E]>) {
  io?.to(room).emit(event, ...payload);
}

/** Ends live connections at once: on sign-out (one session), disable or role change (every session). */
export function disconnectRoom(room: string, reason: string) {
  if (!io) return;
  io.to(room).emit(RealtimeEvent.sessionEnded, { reason });
  io.in(room).disconnectSockets(true);
}

export function sessionRoom(sessionId: string) {
  return `session:${sessionId}`;
}

async function dropEndedSessions(server: RealtimeServer, opts: RealtimeOptions) {
  const sockets = await server.local.fetchSockets();
  const sessionIds = new Set(sockets.map((s) => s.data.sessionId as string));
  for (const sessionId of sessionIds) {
    if (!(await opts.isSessionCurrent(sessionId).catch(() => true))) disconnectRoom(sessionRoom(sessionId), 'session_expired');
  }
}

export async function closeRealtime() {
  if (sweeper) clearInterval(sweeper);
  sweeper = null;
  if (io) await io.close();
  io = null;
  await closeAdapter?.().catch(() => undefined);
  closeAdapter = null;
}
