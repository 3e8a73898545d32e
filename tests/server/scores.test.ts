import { and, eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { activity, score } from '@/db/schema';
import type { ScoreChanged } from '@/server/contracts/matrix';
import type { Score } from '@/server/contracts/scores';

import { createTestApp, type TestUser } from '../helpers/api';
import { scoringTeam, type ScoringTeam } from './fixtures/scoring';

const ctx = createTestApp();
let t: ScoringTeam;

beforeAll(async () => {
  t = await scoringTeam(ctx, 'Ilse');
});
afterAll(() => ctx.close());

const url = () => `/api/reviews/${t.reviewId}/scores`;
type Entry = { candidateId: string; criterionId: string; score: number | null; reason?: string };
const put = (by: TestUser, scores: Entry[]) => by.agent.put(url()).send({ scores });
const storedOf = (userId: string) =>
  ctx.db
    .select()
    .from(score)
    .where(and(eq(score.reviewId, t.reviewId), eq(score.userId, userId)));
const lastChanged = () => ctx.sent.filter((s) => s.reviewId === t.reviewId && s.event === 'score:changed').at(-1);

describe('scores of a review', () => {
  it('stores my scores, answers them, and everyone reads them with names (an Observer too)', async () => {
    const [a, b] = t.candidates;
    const res = await put(t.engineer, [
      { candidateId: a, criterionId: 'complexity', score: 4, reason: 'one shaft, no heat exchanger' },
      { candidateId: b, criterionId: 'complexity', score: 2 },
    ]);
    expect(res.status).toBe(200);
    const mine = res.body.mine as Score[];
    expect(mine.map((s) => [s.candidateId, s.criterionId, s.score, s.reason]).sort()).toEqual(
      [
        [a, 'complexity', 4, 'one shaft, no heat exchanger'],
        [b, 'complexity', 2, ''],
      ].sort(),
    );
    expect(mine.every((s) => s.userId === t.engineer.id && s.name === t.engineer.name)).toBe(true);

    const observer = await t.observer.agent.get(url());
    expect(observer.status).toBe(200);
    expect(observer.body.mine).toEqual([]);
    expect(observer.body.everyone).toHaveLength(2);
    expect(observer.body.everyone.map((s: Score) => s.name)).toEqual([t.engineer.name, t.engineer.name]);

    const engineer = await t.engineer.agent.get(url());
    expect(engineer.body.mine).toHaveLength(2);
  });

  it('replaces a score on a second PUT, and null withdraws it', async () => {
    const [a] = t.candidates;
    await put(t.reviewer, [{ candidateId: a, criterionId: 'maintainability', score: 3 }]).expect(200);
    await put(t.reviewer, [{ candidateId: a, criterionId: 'maintainability', score: 5, reason: 'fewer parts' }]).expect(
      200,
    );
    let rows = await storedOf(t.reviewer.id);
    expect(rows.map((r) => [r.score, r.reason])).toEqual([[5, 'fewer parts']]);
    const res = await put(t.reviewer, [{ candidateId: a, criterionId: 'maintainability', score: null }]);
    expect(res.status).toBe(200);
    expect(res.body.mine).toEqual([]);
    rows = await storedOf(t.reviewer.id);
    expect(rows).toEqual([]);
  });

  it('needs a reason to override a pre-scored criterion, names the entry, and stores nothing', async () => {
    const [a, b] = t.candidates;
    const before = await storedOf(t.lead.id);
    const res = await put(t.lead, [
      { candidateId: a, criterionId: 'complexity', score: 3 },
      { candidateId: b, criterionId: 'efficiency', score: 5 },
    ]);
    expect(res.status).toBe(422);
    expect(res.body.error.field).toBe('scores.1.reason');
    expect(res.body.error.message).toMatch(/Efficiency is pre-scored \d\.\d\d from the results; give a reason/);
    expect(await storedOf(t.lead.id)).toEqual(before);

    const ok = await put(t.lead, [
      { candidateId: a, criterionId: 'complexity', score: 3 },
      { candidateId: b, criterionId: 'efficiency', score: 5, reason: 'the vendor quotes a better recuperator' },
    ]);
    expect(ok.status).toBe(200);
    expect(await storedOf(t.lead.id)).toHaveLength(2);
  });

  it('records one Activity line per change and tells the room score:changed with the touched cells', async () => {
    const [, , c] = t.candidates;
    const linesBefore = await ctx.db
      .select()
      .from(activity)
      .where(and(eq(activity.reviewId, t.reviewId), eq(activity.kind, 'score:changed')));
    await put(t.engineer, [
      { candidateId: c, criterionId: 'complexity', score: 1, reason: 'two compressors and an intercooler' },
      { candidateId: c, criterionId: 'first-cost', score: 2 },
    ]).expect(200);
    const lines = await ctx.db
      .select()
      .from(activity)
      .where(and(eq(activity.reviewId, t.reviewId), eq(activity.kind, 'score:changed')));
    expect(lines).toHaveLength(linesBefore.length + 1);
    expect(lines.at(-1)!.detail).toMatchObject({ scored: 2, withdrawn: 0, candidates: [t.computed[2]!.name] });
    expect(lines.at(-1)!.actorId).toBe(t.engineer.id);

    const sent = lastChanged()!.payload as ScoreChanged;
    expect(sent.by).toEqual({ id: t.engineer.id, name: t.engineer.name });
    expect(sent.scores.map((s) => [s.criterionId, s.score])).toEqual([
      ['complexity', 1],
      ['first-cost', 2],
    ]);
    expect(sent.cells.map((cell) => [cell.candidateId, cell.criterionId])).toEqual([
      [c, 'complexity'],
      [c, 'first-cost'],
    ]);
    expect(sent.cells[1]).toMatchObject({ mean: 2, min: 2, max: 2, count: 1, value: 2, preScore: null });
    expect(Object.keys(sent.totals).sort()).toEqual([...t.candidates].sort());
    expect(Object.keys(sent.ranks).sort()).toEqual([...t.candidates].sort());
    // Compact: no figures, rows or rounds of the whole matrix.
    expect(sent).not.toHaveProperty('rows');
    expect(sent).not.toHaveProperty('figures');
  });

  it('hides scores of a criterion taken out of the basis, and shows them again when it returns', async () => {
    const board = await t.lead.agent.get(`/api/reviews/${t.reviewId}/board`).expect(200);
    const basis = board.body.designBasis;
    const { revision: _r, updatedAt: _u, criteria, ...core } = basis;
    const without = criteria.filter((c: { id: string }) => c.id !== 'first-cost');
    await t.lead.agent
      .put(`/api/reviews/${t.reviewId}/design-basis`)
      .send({ ...core, criteria: without })
      .expect(200);
    const res = await t.engineer.agent.get(url()).expect(200);
    expect(res.body.mine.some((s: Score) => s.criterionId === 'first-cost')).toBe(false);
    // A score for it now is refused at its field.
    const refused = await put(t.engineer, [{ candidateId: t.candidates[0]!, criterionId: 'first-cost', score: 3 }]);
    expect(refused.status).toBe(422);
    expect(refused.body.error.field).toBe('scores.0.criterionId');
    // The stored score was kept, not deleted.
    expect((await storedOf(t.engineer.id)).some((r) => r.criterionId === 'first-cost')).toBe(true);
  });
});
