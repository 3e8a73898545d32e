import { describe, expect, it } from 'vitest';

import { reviewNews } from '@/realtime/events';

import { heard, liveBoards, next, until } from './live-fixture';

/** Scores arrive live in the room: a PUT through the API reaches the other clients on the board. */

const live = liveBoards({ label: 'Scorer', candidates: 2 }, 'Elsewhere');

describe('score:changed', () => {
  it('a Reviewer’s PUT reaches the Observer’s and the Lead’s sockets, and no other Team’s board', async () => {
    const { t, them, onBoard } = live;
    const observer = await onBoard(t.observer.cookie, t.reviewId);
    const lead = await onBoard(t.lead.cookie, t.reviewId);
    const outsider = await onBoard(them.lead.cookie, them.reviewId);
    const outsiderHeard = heard(outsider, 'score:changed');
    const [a, b] = t.candidates;

    const toObserver = next(observer, 'score:changed');
    const toLead = next(lead, 'score:changed');
    const res = await t.reviewer.agent.put(`/api/reviews/${t.reviewId}/scores`).send({
      scores: [
        { candidateId: a, criterionId: 'complexity', score: 4, reason: 'single shaft' },
        { candidateId: b, criterionId: 'complexity', score: 2 },
      ],
    });
    expect(res.status).toBe(200);

    const got = await toObserver;
    expect(reviewNews['score:changed'].safeParse(got).success).toBe(true);
    expect(got.reviewId).toBe(t.reviewId);
    expect(got.by).toEqual({ id: t.reviewer.id, name: t.reviewer.name });
    expect(got.scores.map((s) => [s.candidateId, s.score, s.reason])).toEqual([
      [a, 4, 'single shaft'],
      [b, 2, ''],
    ]);
    expect(got.cells.find((c) => c.candidateId === a)).toMatchObject({ mean: 4, count: 1, criterionId: 'complexity' });
    // Only complexity is scored (the candidates have no results, so no pre-scores): a ranks first.
    expect(got.ranks).toEqual({ [a!]: 1, [b!]: 2 });
    expect(got.totals[a!]).toMatchObject({ total: 4, incomplete: true });
    expect(got.refetch).toBe(true); // the first scorer: every measured cell counts a new person
    expect(await toLead).toEqual(got);

    // A withdrawal arrives as null.
    const withdrawn = next(observer, 'score:changed');
    await t.reviewer.agent
      .put(`/api/reviews/${t.reviewId}/scores`)
      .send({ scores: [{ candidateId: b, criterionId: 'complexity', score: null }] })
      .expect(200);
    const w = await withdrawn;
    expect(w.scores).toMatchObject([{ candidateId: b, score: null }]);
    expect(w.cells[0]).toMatchObject({ mean: null, count: 0, value: null });
    expect(w.ranks[b!]).toBeNull();
    expect(w.refetch).toBe(false);

    // The outsider's board hears nothing of it (a change on their own board proves the socket listens).
    const own = next(outsider, 'score:changed');
    await them.engineer.agent
      .put(`/api/reviews/${them.reviewId}/scores`)
      .send({ scores: [{ candidateId: them.candidates[0], criterionId: 'complexity', score: 3 }] })
      .expect(200);
    await own;
    await until(() => outsiderHeard.length >= 1);
    expect(outsiderHeard.map((p) => p.reviewId)).toEqual([them.reviewId]);
  });
});
