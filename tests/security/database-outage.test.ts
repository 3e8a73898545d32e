import { io as connect, type Socket } from 'socket.io-client';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';

import { retryRefusedHandshakes } from '@/realtime/client';
import type { ClientToServerEvents, ServerToClientEvents } from '@/realtime/events';
import { migrateDatabase } from '@/server/ops/migrate';
import { ensureCluster, ensureDatabase, removeCluster, stopCluster, type Cluster } from '@/server/ops/postgres';

import { signUp, startTeam, type TestUser } from '../helpers/api';
import { freePort } from '../helpers/ports';
import { startTestServer } from '../helpers/test-server';

/**
 * Finding 5: stopping Postgres crashed the Node process (an unhandled `error` event on the
 * pool). This file runs its own cluster so it can stop it; the server runs in this very
 * process, so a crash would end the test run. With the database gone the server answers
 * health with 503 naming the database, refuses work with a clear 503 and changes nothing,
 * and recovers by itself once Postgres is back.
 */

type Client = Socket<ServerToClientEvents, ClientToServerEvents>;

let cluster: Cluster;
let server: Awaited<ReturnType<typeof startTestServer>>;
let lead: TestUser;
let teamId: string;
const sockets: Client[] = [];

const health = async () => {
  const started = performance.now();
  const res = await fetch(`${server.baseURL}/api/health`);
  return { status: res.status, body: await res.json(), ms: performance.now() - started };
};

function open(cookie: string, { retry = false } = {}) {
  const socket: Client = connect(server.baseURL, {
    transports: ['websocket'],
    extraHeaders: { cookie, origin: server.baseURL },
    reconnection: true,
    reconnectionDelay: 100,
    reconnectionDelayMax: 200,
  });
  if (retry) retryRefusedHandshakes(socket, 200);
  sockets.push(socket);
  return socket;
}

const connected = (socket: Client) =>
  new Promise<void>((resolve) => (socket.connected ? resolve() : socket.once('connect', () => resolve())));

beforeAll(async () => {
  cluster = await ensureCluster(await freePort(), { name: `pg-outage-${inject('runId')}` });
  const databaseUrl = await ensureDatabase(cluster, 'cyclemoot_outage', { fresh: true });
  await migrateDatabase(databaseUrl);
  server = await startTestServer({ databaseUrl });
  lead = await signUp(server.baseURL, 'Dora Downtime');
  teamId = await startTeam(lead, 'Outage team');
}, 120_000);
afterAll(async () => {
  for (const s of sockets) s.disconnect();
  await server?.stop();
  if (cluster) removeCluster(cluster);
});

describe('Postgres stopped under a running server', () => {
  let live: Client;

  it('before: health is ok and a socket is in the Team room', async () => {
    expect((await health()).status).toBe(200);
    live = open(lead.cookie);
    await connected(live);
    expect(await live.emitWithAck('team:join', { teamId })).toEqual({ ok: true });
  });

  it('stopping Postgres does not end the process; health answers 503 naming the database, quickly', async () => {
    stopCluster(cluster);
    const down = await health();
    expect(down.status).toBe(503);
    expect(down.body).toEqual({
      status: 'degraded',
      database: { ok: false, message: 'The database is not reachable.' },
    });
    // The driver's message (host, port, user) never reaches the client.
    expect(JSON.stringify(down.body)).not.toMatch(/127\.0\.0\.1|ECONNREFUSED|cyclemoot@|password/i);
    expect(down.ms).toBeLessThan(2_500);
  });

  it('a write with a session is refused with 503 database_unavailable', async () => {
    const res = await lead.agent.post(`/api/teams/${teamId}/reviews`).send({ name: 'Written during the outage' });
    expect(res.status).toBe(503);
    expect(res.body.error).toMatchObject({
      code: 'database_unavailable',
      message: 'The database is not reachable right now; nothing was changed. Try again in a moment.',
    });
    expect(res.headers['retry-after']).toBe('5');
  });

  it('a read and a sign-in are refused with 503 too, never 401 or 500', async () => {
    const read = await lead.agent.get(`/api/teams/${teamId}/reviews`);
    expect(read.status).toBe(503);
    expect(read.body.error.code).toBe('database_unavailable');
    const signIn = await fetch(`${server.baseURL}/api/auth/sign-in/email`, {
      method: 'POST',
      headers: { 'content-type': 'application/json', origin: server.baseURL },
      body: JSON.stringify({ email: lead.email, password: 'correct-horse-battery' }),
    });
    expect(signIn.status).toBe(503);
    expect((await signIn.json()).error.code).toBe('database_unavailable');
  });

  it('a socket already connected stays connected; one joining is told the database is down', async () => {
    expect(live.connected).toBe(true);
    expect(await live.emitWithAck('team:join', { teamId })).toMatchObject({
      error: { code: 'database_unavailable' },
    });
  });

  let refusedSocket: Client;
  it('a new socket handshake is refused with database_unavailable, not the driver’s message', async () => {
    refusedSocket = open(lead.cookie, { retry: true });
    const error = await new Promise<Error>((resolve) => refusedSocket.once('connect_error', resolve));
    expect(error.message).toBe('database_unavailable');
  });

  it('Postgres back: the server recovers by itself, the refused socket connects, nothing was written', async () => {
    const restartedAt = performance.now();
    await ensureCluster(cluster.port, { name: cluster.dataDir.split('/').pop() });
    let recoveredMs = Infinity;
    for (const deadline = Date.now() + 30_000; Date.now() < deadline;) {
      if ((await health()).status === 200) {
        recoveredMs = performance.now() - restartedAt;
        break;
      }
      await new Promise((r) => setTimeout(r, 50));
    }
    console.log(`[outage] health ok ${Math.round(recoveredMs)} ms after Postgres was started again`);
    expect(recoveredMs).toBeLessThan(30_000);

    await connected(refusedSocket);
    expect(await refusedSocket.emitWithAck('team:join', { teamId })).toEqual({ ok: true });
    expect(await live.emitWithAck('team:join', { teamId })).toEqual({ ok: true });

    const list = await lead.agent.get(`/api/teams/${teamId}/reviews`).expect(200);
    expect(JSON.stringify(list.body)).not.toContain('Written during the outage');
    await lead.agent.post(`/api/teams/${teamId}/reviews`).send({ name: 'Written after recovery' }).expect(201);
  });
});
