import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import type { Activity } from '@/server/contracts/team';

import { createTestApp } from '../helpers/api';
import { discussionTeam, type DiscussionTeam } from './fixtures/discussion';

const ctx = createTestApp();
let t: DiscussionTeam;
let otherReviewId: string;

beforeAll(async () => {
  t = await discussionTeam(ctx, 'Tove', 2);
  const other = await t.lead.agent.post(`/api/teams/${t.teamId}/reviews`).send({ name: 'Tove second review' });
  otherReviewId = other.body.id;
  const r = `/api/reviews/${t.reviewId}`;
  await t.lead.agent.put(`${r}/decision`).send({ rationale: 'Because.' }).expect(200);
  await t.lead.agent.put(`${r}/decision`).send({ chosenCandidateId: t.candidates[0] }).expect(200);
  await t.lead.agent.post(`${r}/decision/sign`).send({}).expect(200);
  await t.owner.agent.post(`${r}/decision/reopen`).send({}).expect(201);
  await t.lead.agent.put(`/api/reviews/${otherReviewId}/decision`).send({ rationale: 'Elsewhere.' }).expect(200);
});
afterAll(() => ctx.close());

const timeline = async (query = '') => {
  const res = await t.observer.agent.get(`/api/reviews/${t.reviewId}/activity${query}`);
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return res.body as Activity[];
};

describe('Activity of one Review', () => {
  it('lists this review’s changes newest first, with who did them, and nothing of another review', async () => {
    const lines = await timeline();
    expect(lines.every((a) => a.reviewId === t.reviewId)).toBe(true);
    const decision = lines.filter((a) => a.kind.startsWith('decision:'));
    expect(decision.map((a) => a.kind)).toEqual([
      'decision:reopened',
      'decision:signed',
      'decision:updated',
      'decision:updated',
    ]);
    expect(decision[0]!.actor).toEqual({ id: t.owner.id, name: t.owner.name });
    expect(decision[1]!.detail).toMatchObject({ number: 1, chosenName: 'Candidate 1' });
    expect(lines.at(-1)!.kind).toBe('review:created');
    const times = lines.map((a) => Date.parse(a.createdAt));
    expect([...times].sort((a, b) => b - a)).toEqual(times);
  });

  it('pages back with limit and before', async () => {
    const all = await timeline();
    const first = await timeline('?limit=2');
    expect(first.map((a) => a.id)).toEqual(all.slice(0, 2).map((a) => a.id));
    const rest = await timeline(`?before=${first[1]!.id}`);
    expect(rest.map((a) => a.id)).toEqual(all.slice(2).map((a) => a.id));
  });
});
