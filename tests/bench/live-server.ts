/**
 * One server process for `npm run bench:live` (started by tests/bench/live.bench.ts, never by
 * hand). `BENCH_MODE=product`: the real server (startServer: API, better-auth, socket.io with
 * the Postgres adapter). `BENCH_MODE=bare` / `bare-adapter`: socket.io alone, every client in
 * one room, no session, for the floor; `bare-adapter` adds the same Postgres adapter. It tells
 * the parent its URL over IPC; a `{ floor }` message broadcasts a payload of that many bytes
 * and answers when it was sent.
 */
import { createServer } from 'node:http';
import type { AddressInfo } from 'node:net';

import { createAdapter } from '@socket.io/postgres-adapter';
import { Pool } from 'pg';
import { Server } from 'socket.io';

import { startServer } from '@/server/index';
import { ensureSocketAttachments } from '@/server/services/live';

import { benchRoom, clock, type ParentMessage, type ServerMessage } from './live-shared';

const send = (message: ServerMessage) => process.send?.(message);
const mode = process.env.BENCH_MODE ?? 'product';
const databaseUrl = process.env.BENCH_DATABASE_URL ?? '';

async function product() {
  const server = await startServer({
    databaseUrl,
    secret: process.env.BENCH_SECRET ?? '',
    smtp: { host: '127.0.0.1', port: Number(process.env.BENCH_SMTP_PORT) },
    port: 0,
    // The N clients are tabs of five people; the per-user connection allowance is raised so
    // a large N can connect at once. Every other rule is the production one.
    socketLimits: {
      eventsPerSocket: { points: 40, seconds: 2 },
      eventsPerUser: { points: 100_000, seconds: 2 },
      connectionsPerUser: { points: 100_000, seconds: 60 },
    },
  });
  send({ url: server.url });
  return () => server.close();
}

async function bare(withAdapter: boolean) {
  const httpServer = createServer();
  const pool = withAdapter ? new Pool({ connectionString: databaseUrl, max: 4 }) : null;
  if (pool) await ensureSocketAttachments(pool);
  const io = new Server(httpServer, {
    serveClient: false,
    ...(pool ? { adapter: createAdapter(pool, { heartbeatInterval: 2_000, heartbeatTimeout: 6_000 }) } : {}),
  });
  io.on('connection', (socket) => void socket.join(benchRoom));
  await new Promise<void>((resolve) => httpServer.listen(0, '127.0.0.1', () => resolve()));
  const { port } = httpServer.address() as AddressInfo;
  process.on('message', (message: ParentMessage) => {
    if (!('floor' in message)) return;
    const { key, bytes } = message.floor;
    const payload = { candidate: { revision: key, padding: 'x'.repeat(bytes) } };
    const sentAt = clock();
    io.to(benchRoom).emit('candidate:recomputed', payload);
    send({ sentAt, key });
  });
  send({ url: `http://127.0.0.1:${port}` });
  return async () => {
    await io.close();
    await pool?.end();
  };
}

async function main() {
  const stop = mode === 'product' ? await product() : await bare(mode === 'bare-adapter');
  process.on('message', (message: ParentMessage) => {
    if ('stop' in message) void stop().finally(() => process.exit(0));
  });
  process.on('disconnect', () => void stop().finally(() => process.exit(0)));
}

main().catch((error: unknown) => {
  console.error('[bench server] failed:', error);
  process.exit(1);
});
