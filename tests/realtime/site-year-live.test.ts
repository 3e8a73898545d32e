import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { reviewNews } from '@/realtime/events';
import { demoSiteYearCsv } from '@/server/ops/demo-site-year';

import { createTestApp } from '../helpers/api';
import { startTestServer } from '../helpers/test-server';
import { boardTeam, heard, next, openClient, until, type BoardTeam, type Client } from './live-fixture';

/** site-year:updated reaches the room's members after an upload or a removal, and no other Team's board. */

let server: Awaited<ReturnType<typeof startTestServer>>;
let ctx: ReturnType<typeof createTestApp>;
const sockets: Client[] = [];
let t: BoardTeam;
let them: BoardTeam;
const csv = Buffer.from(demoSiteYearCsv(), 'utf8');

async function onBoard(cookie: string, reviewId: string) {
  const socket = await openClient(server.baseURL, cookie, sockets);
  expect(await socket.emitWithAck('review:join', { reviewId })).toEqual({ ok: true });
  return socket;
}

beforeAll(async () => {
  server = await startTestServer();
  ctx = createTestApp();
  t = await boardTeam(ctx, server.baseURL, 'Yearly', 1);
  them = await boardTeam(ctx, server.baseURL, 'Elsewhere', 1);
});
afterAll(async () => {
  for (const s of sockets) s.disconnect();
  await server.stop();
  await ctx.close();
});

describe('site-year:updated', () => {
  it("an upload and a removal reach the Observer's socket with the summary, and no other Team's board", async () => {
    const observer = await onBoard(t.observer.cookie, t.reviewId);
    const outsider = await onBoard(them.lead.cookie, them.reviewId);
    const outsiderHeard = heard(outsider, 'site-year:updated');

    const uploaded = next(observer, 'site-year:updated');
    const res = await t.lead.agent.put(`/api/reviews/${t.reviewId}/site-year`).attach('file', csv, 'fell.csv');
    expect(res.status).toBe(200);
    const got = await uploaded;
    expect(reviewNews['site-year:updated'].safeParse(got).success).toBe(true);
    expect(got).toEqual({ reviewId: t.reviewId, profile: res.body });

    const removed = next(observer, 'site-year:updated');
    await t.lead.agent.delete(`/api/reviews/${t.reviewId}/site-year`).expect(204);
    expect(await removed).toEqual({ reviewId: t.reviewId, profile: null });

    // A refused upload tells nobody.
    const before = heard(observer, 'site-year:updated');
    await t.lead.agent
      .put(`/api/reviews/${t.reviewId}/site-year`)
      .attach('file', Buffer.from('hour,x\n1,2\n'), 'b.csv')
      .expect(422);
    // The outsider's own board hears its own news (so its socket listens), never the other Team's.
    const own = next(outsider, 'site-year:updated');
    await them.lead.agent.put(`/api/reviews/${them.reviewId}/site-year`).attach('file', csv, 'own.csv').expect(200);
    await own;
    await until(() => outsiderHeard.length === 1);
    expect(outsiderHeard.map((p) => p.reviewId)).toEqual([them.reviewId]);
    expect(before).toEqual([]);
  });
});
