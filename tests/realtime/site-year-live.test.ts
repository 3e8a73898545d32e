import { describe, expect, it } from 'vitest';

import { reviewNews } from '@/realtime/events';
import { demoSiteYearCsv } from '@/server/ops/demo-site-year';

import { heard, liveBoards, next, until } from './live-fixture';

/** site-year:updated reaches the room's members after an upload or a removal, and no other Team's board. */

const live = liveBoards({ label: 'Yearly', candidates: 1 }, 'Elsewhere');
const csv = Buffer.from(demoSiteYearCsv(), 'utf8');

describe('site-year:updated', () => {
  it("an upload and a removal reach the Observer's socket with the summary, and no other Team's board", async () => {
    const { t, them, onBoard } = live;
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
