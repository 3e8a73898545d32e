import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { reviewNews } from '@/realtime/events';

import { createTestApp } from '../helpers/api';
import { startTestServer } from '../helpers/test-server';
import { pdfBytes } from '../server/fixtures/files';
import { boardTeam, heard, next, openClient, until, type BoardTeam, type Client } from './live-fixture';

/** file:added and file:removed reach the Review's room on a real server, and no other Team's board. */

let server: Awaited<ReturnType<typeof startTestServer>>;
let ctx: ReturnType<typeof createTestApp>;
const sockets: Client[] = [];
let t: BoardTeam;
let them: BoardTeam;

async function onBoard(cookie: string, reviewId: string) {
  const socket = await openClient(server.baseURL, cookie, sockets);
  expect(await socket.emitWithAck('review:join', { reviewId })).toEqual({ ok: true });
  return socket;
}

beforeAll(async () => {
  server = await startTestServer();
  ctx = createTestApp();
  t = await boardTeam(ctx, server.baseURL, 'Filer', 1);
  them = await boardTeam(ctx, server.baseURL, 'Stranger', 1);
});
afterAll(async () => {
  for (const s of sockets) s.disconnect();
  await server.stop();
  await ctx.close();
});

describe('file news', () => {
  it('an Engineer’s upload and delete reach the Observer on the board, and nobody on another Team’s', async () => {
    const observer = await onBoard(t.observer.cookie, t.reviewId);
    const outsider = await onBoard(them.lead.cookie, them.reviewId);
    const outsiderAdded = heard(outsider, 'file:added');
    const outsiderRemoved = heard(outsider, 'file:removed');
    // Another Team's member cannot join this board to listen.
    expect(
      await (
        await openClient(server.baseURL, them.lead.cookie, sockets)
      ).emitWithAck('review:join', { reviewId: t.reviewId }),
    ).toMatchObject({
      error: { code: 'not_found' },
    });

    const added = next(observer, 'file:added');
    const up = await t.engineer.agent
      .post(`/api/reviews/${t.reviewId}/files`)
      .field('candidateId', t.candidates[0])
      .attach('file', pdfBytes(), 'compressor-map.pdf');
    expect(up.status).toBe(201);
    const got = await added;
    expect(reviewNews['file:added'].safeParse(got).success).toBe(true);
    expect(got.file).toEqual(up.body);

    const removed = next(observer, 'file:removed');
    expect((await t.engineer.agent.delete(`/api/files/${up.body.id}`)).status).toBe(204);
    expect(await removed).toEqual({ reviewId: t.reviewId, fileId: up.body.id, candidateId: t.candidates[0] });

    // The outsider's own board hears its own files, and only those.
    const theirs = next(outsider, 'file:added');
    await them.lead.agent
      .post(`/api/reviews/${them.reviewId}/files`)
      .attach('file', pdfBytes(), 'theirs.pdf')
      .expect(201);
    await theirs;
    await until(() => outsiderAdded.length >= 1);
    expect(outsiderAdded.map((p) => p.file.reviewId)).toEqual([them.reviewId]);
    expect(outsiderRemoved).toEqual([]);
  });
});
