import { io as connect, type Socket } from 'socket.io-client';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import type { ClientToServerEvents, ServerToClientEvents } from '@/realtime/events';
import { productionSocketLimits } from '@/realtime/server';

import { signUp, startTeam, type TestUser } from '../helpers/api';
import { startTestServer } from '../helpers/test-server';

/**
 * Finding 7: one socket sent 3000 `team:join` in 1.5 s; each one reached the database and
 * the health check slowed from about 1 ms to 900 ms. Events are now counted per socket and
 * per user before any handler runs; a socket that keeps flooding is closed.
 */

type Client = Socket<ServerToClientEvents, ClientToServerEvents>;
type AckResult = { ok: true } | { error: { code: string; message: string } };

let server: Awaited<ReturnType<typeof startTestServer>>;
let lead: TestUser;
let teamId: string;
const sockets: Client[] = [];

function open(cookie: string) {
  const socket: Client = connect(server.baseURL, {
    transports: ['websocket'],
    extraHeaders: { cookie, origin: server.baseURL },
    reconnection: false,
  });
  sockets.push(socket);
  return new Promise<Client>((resolve, reject) => {
    socket.once('connect', () => resolve(socket));
    socket.once('connect_error', reject);
  });
}

beforeAll(async () => {
  server = await startTestServer({ socketLimits: productionSocketLimits });
  lead = await signUp(server.baseURL, 'Flora Flood');
  teamId = await startTeam(lead, 'Flood team');
});
afterAll(async () => {
  for (const s of sockets) s.disconnect();
  await server.stop();
});

describe('an event flood from one socket', () => {
  it('3000 team:join in a burst: the allowance is served, the rest refused, and the socket closed', async () => {
    const socket = await open(lead.cookie);
    const closed = new Promise<string>((resolve) => socket.once('disconnect', resolve));
    const acks: AckResult[] = [];
    for (let i = 0; i < 3000; i++) socket.emit('team:join', { teamId }, (r: AckResult) => void acks.push(r));

    expect(await closed).toBe('io server disconnect');
    // Joins still at the database when the socket closed lose their ack; none past the
    // allowance got that far.
    const served = acks.filter((a) => 'ok' in a).length;
    const refused = acks.filter((a) => 'error' in a && a.error.code === 'rate_limited');
    expect(served).toBeLessThanOrEqual(productionSocketLimits.eventsPerSocket.points);
    expect(refused.length).toBeGreaterThan(0);
    expect(refused[0]).toMatchObject({ error: { message: expect.stringMatching(/Too many events; wait \d+ s/) } });
    // Nothing past the close was handled.
    expect(served + refused.length).toBeLessThanOrEqual(2 * productionSocketLimits.eventsPerSocket.points + 1);

    // The server goes on serving everyone else.
    const health = await fetch(`${server.baseURL}/api/health`);
    expect(health.status).toBe(200);
  });

  it('a socket that stays within its allowance is never refused', async () => {
    const calm = await signUp(server.baseURL, 'Cato Calm');
    const calmTeam = await startTeam(calm, 'Calm team');
    const socket = await open(calm.cookie);
    for (let i = 0; i < productionSocketLimits.eventsPerSocket.points / 2; i++) {
      expect(await socket.emitWithAck('team:join', { teamId: calmTeam })).toEqual({ ok: true });
    }
    expect(socket.connected).toBe(true);
  });

  it('opening socket after socket to get fresh allowances is bounded per user', async () => {
    const { points } = productionSocketLimits.connectionsPerUser;
    const outcomes = await Promise.allSettled(Array.from({ length: points + 5 }, () => open(lead.cookie)));
    const refused = outcomes.filter((o) => o.status === 'rejected');
    expect(refused.length).toBeGreaterThanOrEqual(5);
    expect((refused[0] as PromiseRejectedResult).reason.message).toBe('rate_limited');
  });
});
