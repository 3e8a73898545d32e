import { describe, expect, it } from 'vitest';

import { reviewNews } from '@/server/contracts/news';

import { heard, liveBoards, next, until } from './live-fixture';

const live = liveBoards({ label: 'Signe', candidates: 2 }, 'Outsider');

describe('the decision record, live', () => {
  it('an edit reaches another member as decision:updated, the signature as decision:signed; another board hears nothing', async () => {
    const { t, them, onBoard } = live;
    const reviewer = await onBoard(t.reviewer.cookie, t.reviewId);
    const outsider = await onBoard(them.lead.cookie, them.reviewId);
    const strayUpdates = heard(outsider, 'decision:updated');
    const straySigned = heard(outsider, 'decision:signed');

    const updated = next(reviewer, 'decision:updated', (p) => p.revision.rationale === 'Best part-load behaviour.');
    await t.lead.agent
      .put(`/api/reviews/${t.reviewId}/decision`)
      .send({ chosenCandidateId: t.candidates[1], rationale: 'Best part-load behaviour.' })
      .expect(200);
    const u = reviewNews['decision:updated'].parse(await updated);
    expect(u).toMatchObject({ reviewId: t.reviewId, revision: { number: 1, status: 'draft' } });

    const signed = next(reviewer, 'decision:signed');
    await t.lead.agent.post(`/api/reviews/${t.reviewId}/decision/sign`).send({}).expect(200);
    const s = reviewNews['decision:signed'].parse(await signed);
    expect(s.revision).toMatchObject({
      number: 1,
      status: 'signed',
      chosenCandidateId: t.candidates[1],
      signedBy: { id: t.lead.id, name: t.lead.name },
    });
    expect(s.revision).not.toHaveProperty('snapshot');
    // The chosen candidate's new status comes through the candidates service as usual.
    const recomputed = await next(reviewer, 'candidate:recomputed', (p) => p.candidate.id === t.candidates[1]);
    expect(recomputed.candidate.status).toBe('chosen');

    const reopened = next(reviewer, 'decision:updated', (p) => p.revision.number === 2);
    await t.owner.agent.post(`/api/reviews/${t.reviewId}/decision/reopen`).send({}).expect(201);
    expect((await reopened).revision.status).toBe('draft');

    // Give a stray event time to arrive before saying none came.
    const marker = next(outsider, 'decision:updated');
    await them.lead.agent.put(`/api/reviews/${them.reviewId}/decision`).send({ rationale: 'Ours.' }).expect(200);
    await marker;
    await until(() => strayUpdates.length > 0);
    expect(strayUpdates.map((p) => p.reviewId)).toEqual([them.reviewId]);
    expect(straySigned).toEqual([]);
  });
});
