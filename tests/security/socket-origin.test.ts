import { io as connect, type Socket } from 'socket.io-client';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import type { ClientToServerEvents, ServerToClientEvents } from '@/realtime/events';

import { signUp, startTeam, type TestUser } from '../helpers/api';
import { startTestServer } from '../helpers/test-server';

/**
 * Finding 6: socket.io accepted a cookie-bearing WebSocket from any Origin (its `cors`
 * option covers polling only), so another site's page could join a Team's room with the
 * visitor's cookie and hear its news.
 */

type Client = Socket<ServerToClientEvents, ClientToServerEvents>;

let server: Awaited<ReturnType<typeof startTestServer>>;
let lead: TestUser;
let teamId: string;
const sockets: Client[] = [];

function open(headers: Record<string, string>, transports: Array<'websocket' | 'polling'> = ['websocket']) {
  const socket: Client = connect(server.baseURL, { transports, extraHeaders: headers, reconnection: false });
  sockets.push(socket);
  return new Promise<Client>((resolve, reject) => {
    socket.once('connect', () => resolve(socket));
    socket.once('connect_error', reject);
  });
}

beforeAll(async () => {
  server = await startTestServer();
  lead = await signUp(server.baseURL, 'Sorrel Socket');
  teamId = await startTeam(lead, 'Socket origin team');
});
afterAll(async () => {
  for (const s of sockets) s.disconnect();
  await server.stop();
});

describe('cross-origin WebSockets carrying the session cookie', () => {
  for (const [what, origin] of [
    ['a foreign Origin', 'https://evil.example'],
    ['an Origin that only starts like ours', `${'http://127.0.0.1'}:1.evil.example`],
    ['the opaque Origin null', 'null'],
  ] as const) {
    for (const transport of ['websocket', 'polling'] as const) {
      it(`a ${transport} handshake with ${what} is refused before the session is read`, async () => {
        await expect(open({ cookie: lead.cookie, origin }, [transport])).rejects.toThrow();
      });
    }
  }

  it('a handshake without any Origin is refused', async () => {
    await expect(open({ cookie: lead.cookie })).rejects.toThrow();
  });

  it('the raw upgrade request from a foreign page gets no WebSocket', async () => {
    const url = `${server.baseURL}/socket.io/?EIO=4&transport=polling`;
    const res = await fetch(url, { headers: { cookie: lead.cookie, origin: 'https://evil.example' } });
    expect(res.status).toBe(403);
    expect(await res.text()).not.toContain('"sid"');
  });

  it('the app’s own origin still connects and joins its Team', async () => {
    const socket = await open({ cookie: lead.cookie, origin: server.baseURL });
    expect(await socket.emitWithAck('team:join', { teamId })).toEqual({ ok: true });
  });
});
