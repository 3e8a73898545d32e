/**
 * The N socket.io clients of `npm run bench:live`, in a process of their own (started by
 * tests/bench/live.bench.ts). Client i connects to `urls[i % urls.length]` as
 * `cookies[i % cookies.length]` and joins the review (or, on a bare server, is put in its room).
 * For each `candidate:recomputed` it counts receipts by revision; when all N have it, it tells
 * the parent when the last one arrived.
 */
import { io as connect, type Socket } from 'socket.io-client';

import { clock, type ClientsMessage, type ClientsSetup } from './live-shared';

const send = (message: ClientsMessage) => process.send?.(message);

async function open(setup: ClientsSetup, i: number): Promise<Socket> {
  const url = setup.urls[i % setup.urls.length];
  const cookie = setup.cookies.length ? setup.cookies[i % setup.cookies.length] : undefined;
  const socket = connect(url, {
    transports: ['websocket'],
    extraHeaders: cookie ? { cookie, origin: url } : { origin: url },
    reconnection: false,
    forceNew: true,
  });
  await new Promise<void>((resolve, reject) => {
    socket.once('connect', () => resolve());
    socket.once('connect_error', reject);
  });
  if (setup.reviewId) {
    const ack = (await socket.emitWithAck('review:join', { reviewId: setup.reviewId })) as { ok?: true };
    if (!ack.ok) throw new Error(`review:join refused: ${JSON.stringify(ack)}`);
  }
  return socket;
}

async function run(setup: ClientsSetup) {
  const started = clock();
  const sockets: Socket[] = [];
  // A few at a time, as people arrive; all at once would only measure the handshake queue.
  for (let i = 0; i < setup.clients; i += 10) {
    const batch = await Promise.all(
      Array.from({ length: Math.min(10, setup.clients - i) }, (_, j) => open(setup, i + j)),
    );
    sockets.push(...batch);
  }
  const receipts = new Map<number, { count: number; lastAt: number }>();
  for (const socket of sockets) {
    socket.on('candidate:recomputed', (payload: { candidate: { revision: number } }) => {
      const at = clock();
      const key = payload.candidate.revision;
      const seen = receipts.get(key) ?? { count: 0, lastAt: 0 };
      seen.count += 1;
      seen.lastAt = Math.max(seen.lastAt, at);
      receipts.set(key, seen);
      if (seen.count === sockets.length) {
        receipts.delete(key);
        send({ all: true, key, lastAt: seen.lastAt, bytes: Buffer.byteLength(JSON.stringify(payload)) });
      }
    });
  }
  send({ ready: true, connectMs: clock() - started });
  process.on('message', (message: { stop?: true }) => {
    if (!message.stop) return;
    for (const socket of sockets) socket.disconnect();
    process.exit(0);
  });
}

process.once('message', (setup: ClientsSetup) => {
  run(setup).catch((error: unknown) => {
    send({ failed: error instanceof Error ? error.message : String(error) });
    process.exit(1);
  });
});
process.on('disconnect', () => process.exit(0));
