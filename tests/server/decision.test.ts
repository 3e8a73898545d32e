import { and, eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { activity, candidate } from '@/db/schema';
import type { CandidateWire } from '@/server/contracts/board';
import { decisionRevisionSchema, type DecisionRevision } from '@/server/contracts/decision';

import { createTestApp } from '../helpers/api';
import { waitForMail } from '../helpers/test-server';
import { completeDraft, computedCandidates } from './fixtures/decision';
import { discussionTeam, type DiscussionTeam } from './fixtures/discussion';

const ctx = createTestApp();
let t: DiscussionTeam;
let cands: CandidateWire[];

beforeAll(async () => {
  t = await discussionTeam(ctx, 'Ingrid', 0);
  cands = await computedCandidates(t.lead, t.reviewId, ['Plain cycle', 'Recuperated', 'Intercooled pair']);
});
afterAll(() => ctx.close());

const base = () => `/api/reviews/${t.reviewId}/decision`;
const read = async () => {
  const res = await t.engineer.agent.get(base());
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return res.body as { current: DecisionRevision; revisions: DecisionRevision[] };
};
const kinds = async () =>
  (
    await ctx.db
      .select({ kind: activity.kind })
      .from(activity)
      .where(and(eq(activity.reviewId, t.reviewId)))
  ).map((r) => r.kind);
const told = (event: string) => ctx.sent.filter((s) => s.reviewId === t.reviewId && s.event === event);

describe('the decision record of a review, from draft to reopened', () => {
  it('reading makes revision 1, an empty draft, and every member may read it', async () => {
    const first = await read();
    expect(first.current).toMatchObject({
      number: 1,
      status: 'draft',
      chosenCandidateId: null,
      rationale: '',
      rejected: [],
      snapshot: null,
      signedBy: null,
    });
    expect(first.revisions.map((r) => r.number)).toEqual([1]);
    decisionRevisionSchema.parse(first.current);
    // A second read makes no second revision.
    expect((await t.observer.agent.get(base()).expect(200)).body.revisions).toHaveLength(1);
  });

  it('the Lead edits the draft field by field; the rest stays; each change is in Activity and told to the room', async () => {
    const before = told('decision:updated').length;
    const res = await t.lead.agent
      .put(base())
      .send({ rationale: '  First thoughts.  ', chosenCandidateId: cands[1]!.id });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body).toMatchObject({ rationale: 'First thoughts.', chosenCandidateId: cands[1]!.id, status: 'draft' });
    expect(res.body.updatedBy).toEqual({ id: t.lead.id, name: t.lead.name });

    const more = await t.owner.agent.put(base()).send({ assumptions: 'Hot day.' });
    expect(more.body).toMatchObject({
      rationale: 'First thoughts.',
      assumptions: 'Hot day.',
      chosenCandidateId: cands[1]!.id,
    });
    expect((await read()).current.assumptions).toBe('Hot day.');
    expect(told('decision:updated').length).toBe(before + 2);
    const last = told('decision:updated').at(-1)!.payload as { revision: Record<string, unknown> };
    expect(last.revision).not.toHaveProperty('snapshot'); // compact
    expect((await kinds()).filter((k) => k === 'decision:updated').length).toBeGreaterThanOrEqual(2);
  });

  it('refuses a chosen candidate listed as rejected, a due date that is no day, and names the field', async () => {
    const clash = await t.lead.agent
      .put(base())
      .send({ rejected: [{ candidateId: cands[1]!.id, reason: 'Too costly.' }] });
    expect(clash.status).toBe(422);
    expect(clash.body.error.field).toBe('rejected.0.candidateId');
    const due = await t.lead.agent.put(base()).send({ actions: [{ text: 'Check', owner: 'Me', due: '2027-02-30' }] });
    expect(due.status).toBe(422);
    expect(due.body.error.field).toBe('actions.0.due');
    expect((await read()).current.rejected).toEqual([]);
  });

  it('signing needs a chosen candidate and a rationale (422 naming each), and changes nothing when refused', async () => {
    await t.lead.agent.put(base()).send({ chosenCandidateId: null, rationale: '' }).expect(200);
    const noChoice = await t.lead.agent.post(`${base()}/sign`).send({});
    expect(noChoice.status).toBe(422);
    expect(noChoice.body.error.field).toBe('chosenCandidateId');
    await t.lead.agent.put(base()).send({ chosenCandidateId: cands[0]!.id }).expect(200);
    const noWhy = await t.lead.agent.post(`${base()}/sign`).send({});
    expect(noWhy.status).toBe(422);
    expect(noWhy.body.error.field).toBe('rationale');
    const now = await read();
    expect(now.current.status).toBe('draft');
    expect(now.current.snapshot).toBeNull();
    expect(await kinds()).not.toContain('decision:signed');
  });

  let signed: DecisionRevision;

  it('the Lead signs: signer, time and a snapshot of basis, candidates, scores, matrix and rounds; the chosen one is marked Chosen; members are mailed', async () => {
    await t.lead.agent.put(base()).send(completeDraft(cands[0]!, cands[2]!)).expect(200);
    const res = await t.lead.agent.post(`${base()}/sign`).send({});
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    signed = decisionRevisionSchema.parse(res.body);
    expect(signed.status).toBe('signed');
    expect(signed.signedBy).toEqual({ id: t.lead.id, name: t.lead.name });
    expect(Math.abs(Date.parse(signed.signedAt!) - Date.now())).toBeLessThan(60_000);
    const snap = signed.snapshot!;
    expect(snap.candidates.map((c) => c.name)).toEqual(cands.map((c) => c.name));
    expect(snap.candidates[0]!.results).toMatchObject({ thermalEfficiency: cands[0]!.results!.thermalEfficiency });
    expect(snap.candidates[0]!.parameters).toEqual(cands[0]!.parameters);
    expect(snap.designBasis.criteria.length).toBeGreaterThan(0);
    expect(snap.matrix.candidates.map((c) => c.id)).toEqual(cands.map((c) => c.id));
    expect(Array.isArray(snap.rounds)).toBe(true);
    expect(Array.isArray(snap.scores)).toBe(true);

    expect(told('decision:signed').length).toBe(1);
    expect(await kinds()).toContain('decision:signed');
    const [row] = await ctx.db.select().from(candidate).where(eq(candidate.id, cands[0]!.id));
    expect(row!.status).toBe('chosen');

    for (const who of [t.owner, t.lead, t.engineer, t.reviewer, t.observer]) {
      const mail = await waitForMail(who.email, /^Decision signed in/);
      expect(mail.text).toContain(`/reviews/${t.reviewId}/decision`);
      expect(mail.text).toContain(cands[0]!.name);
    }
  });

  it('a signed record is read-only: edits and a second signature are refused with 409', async () => {
    const edit = await t.lead.agent.put(base()).send({ rationale: 'Changed my mind.' });
    expect(edit.status).toBe(409);
    expect(edit.body.error.code).toBe('decision_signed');
    expect(edit.body.error.message).toMatch(/signed and read-only; reopen it/);
    expect((await t.lead.agent.post(`${base()}/sign`).send({})).status).toBe(409);
    expect((await read()).current.rationale).toBe(signed.rationale);
  });

  it('later board edits do not change the snapshot', async () => {
    const patched = await t.lead.agent
      .patch(`/api/reviews/${t.reviewId}/candidates/${cands[0]!.id}`)
      .send({ name: 'Plain cycle, renamed', parameters: { compressor: { pressureRatio: 9 } } });
    expect(patched.status, JSON.stringify(patched.body)).toBe(200);
    expect(patched.body.results.thermalEfficiency).not.toBe(cands[0]!.results!.thermalEfficiency);
    const now = (await read()).current;
    expect(now.snapshot).toEqual(signed.snapshot);
    expect(now.snapshot!.candidates[0]!.name).toBe('Plain cycle');
  });

  it('reopening makes revision 2, a draft copied from 1; revision 1 stays readable as signed', async () => {
    const res = await t.owner.agent.post(`${base()}/reopen`).send({});
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body).toMatchObject({
      number: 2,
      status: 'draft',
      chosenCandidateId: signed.chosenCandidateId,
      rationale: signed.rationale,
      rejected: signed.rejected,
      dissent: signed.dissent,
      actions: signed.actions,
      snapshot: null,
      signedBy: null,
    });
    expect((await t.lead.agent.post(`${base()}/reopen`).send({})).status).toBe(409);
    await t.lead.agent.put(base()).send({ rationale: 'Revised after the part-load data.' }).expect(200);
    const now = await read();
    expect(now.revisions.map((r) => [r.number, r.status])).toEqual([
      [2, 'draft'],
      [1, 'signed'],
    ]);
    expect(now.current.number).toBe(2);
    expect(now.revisions[1]).toEqual(signed);
    expect(await kinds()).toContain('decision:reopened');
  });

  it('signing revision 2 keeps both signed revisions, each with its own snapshot', async () => {
    await t.lead.agent.post(`${base()}/sign`).send({}).expect(200);
    const now = await read();
    expect(now.revisions.map((r) => [r.number, r.status])).toEqual([
      [2, 'signed'],
      [1, 'signed'],
    ]);
    expect(now.current.number).toBe(2);
    expect(now.revisions[0]!.snapshot!.candidates[0]!.name).toBe('Plain cycle, renamed');
    expect(now.revisions[1]!.snapshot!.candidates[0]!.name).toBe('Plain cycle');
  });
});
