import { io, type Socket } from 'socket.io-client';

import type { ClientToServerEvents, ServerToClientEvents } from './events';

export type RealtimeSocket = Socket<ServerToClientEvents, ClientToServerEvents>;

let shared: RealtimeSocket | null = null;

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
  }
  return shared;
}

/** Closes the shared socket (on sign-out, so the next user gets a fresh handshake). */
export function closeRealtimeSocket(): void {
  shared?.disconnect();
  shared = null;
}
