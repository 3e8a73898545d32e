import { io, type Socket } from 'socket.io-client';

import type { ClientToServerEvents, ServerToClientEvents } from './events';

export type RealtimeSocket = Socket<ServerToClientEvents, ClientToServerEvents>;

let shared: RealtimeSocket | null = null;
/** Sockets closed on purpose (sign-out): a pending retry must not reopen them. */
const closed = new WeakSet<Socket>();

/**
 * One socket per app, opened on first use. The browser sends the session cookie on the
 * same origin, so no token travels in the handshake.
 */
export function getRealtimeSocket(origin: string): RealtimeSocket {
  if (!shared) {
    shared = io(origin, {
      path: '/socket.io',
      withCredentials: true,
      transports: ['websocket', 'polling'],
      reconnectionDelayMax: 10_000,
    });
    retryRefusedHandshakes(shared);
  }
  return shared;
}

/**
 * socket.io retries a dropped connection by itself, but not one the server refused during
 * the handshake. A refusal that passes (database down, too many reconnects) is retried
 * after a pause; `unauthorized` is not: the session is gone.
 */
export function retryRefusedHandshakes(socket: Socket, delayMs = 5_000): void {
  socket.on('connect_error', (error) => {
    if (socket.active || error.message === 'unauthorized') return;
    setTimeout(() => {
      if (!socket.connected && !closed.has(socket)) socket.connect();
    }, delayMs);
  });
}

/** Closes the shared socket (on sign-out, so the next user gets a fresh handshake). */
export function closeRealtimeSocket(): void {
  if (shared) closed.add(shared);
  shared?.disconnect();
  shared = null;
}
