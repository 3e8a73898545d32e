import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { gatherGraceMs } from '@/realtime/handlers/review-room';
import { gatheringOf } from '@/server/services/live';

import { createTestApp } from '../helpers/api';
import { startTestServer } from '../helpers/test-server';
import {
  addCandidates,
  addReview,
  boardTeam,
  heard,
  joinBoard,
  next,
  openClient,
  seen,
  until,
  type BoardTeam,
  type Client,
} from './live-fixture';

let server: Awaited<ReturnType<typeof startTestServer>>;
let ctx: ReturnType<typeof createTestApp>;
const sockets: Client[] = [];
const open = (cookie?: string) => openClient(server.baseURL, cookie, sockets);

const onBoard = (cookie: string, reviewId: string) => joinBoard(server.baseURL, cookie, reviewId, sockets);

beforeAll(async () => {
  server = await startTestServer();
  ctx = createTestApp();
});
afterAll(async () => {
  for (const s of sockets) s.disconnect();
  await server.stop();
  await ctx.close();
});

describe('joining and leaving a review board', () => {
  let t: BoardTeam;
  beforeAll(async () => {
    t = await boardTeam(ctx, server.baseURL, 'Joiner');
  });

  it('a member joins: ok first, then the room is told who is here; leaving takes them off', async () => {
    const lead = await open(t.lead.cookie);
    const order: string[] = [];
    lead.on('presence:changed', () => order.push('presence'));
    const ack = lead.emitWithAck('review:join', { reviewId: t.reviewId }).then((a) => {
      order.push('ack');
      return a;
    });
    const first = next(lead, 'presence:changed');
    expect(await ack).toEqual({ ok: true });
    expect((await first).people).toEqual([{ userId: t.lead.id, name: t.lead.name, role: 'lead', candidateId: null }]);
    expect(order.slice(0, 2)).toEqual(['ack', 'presence']);

    const engineer = await open(t.engineer.cookie);
    const both = next(lead, 'presence:changed', (p) => p.people.length === 2);
    expect(await engineer.emitWithAck('review:join', { reviewId: t.reviewId })).toEqual({ ok: true });
    expect((await both).people.map((p) => [p.name, p.role])).toEqual([
      [t.engineer.name, 'engineer'],
      [t.lead.name, 'lead'],
    ]);

    const gone = next(lead, 'presence:changed', (p) => p.people.length === 1);
    expect(await engineer.emitWithAck('review:leave', { reviewId: t.reviewId })).toEqual({ ok: true });
    expect(seen(await gone)).toEqual([`${t.lead.name}:board`]);
    // Leaving a board one is not on is harmless.
    expect(await engineer.emitWithAck('review:leave', { reviewId: t.reviewId })).toEqual({ ok: true });
    lead.disconnect();
    engineer.disconnect();
  });
});

describe('presence', () => {
  let t: BoardTeam;
  beforeAll(async () => {
    t = await boardTeam(ctx, server.baseURL, 'Presence');
  });

  it('one entry per person over their tabs, what each looks at, and leaving removes them', async () => {
    const [a, b] = t.candidates;
    const reviewer = await onBoard(t.reviewer.cookie, t.reviewId);
    const news = heard(reviewer, 'presence:changed');
    const latest = () => news[news.length - 1];
    const leadTab1 = await onBoard(t.lead.cookie, t.reviewId);
    const leadTab2 = await onBoard(t.lead.cookie, t.reviewId);
    await until(() => latest()?.people.length === 2);
    expect(seen(latest())).toEqual([`${t.lead.name}:board`, `${t.reviewer.name}:board`]);

    // The tab that chose last says what the person looks at.
    expect(await leadTab2.emitWithAck('presence:viewing', { reviewId: t.reviewId, candidateId: a })).toEqual({
      ok: true,
    });
    await until(() => seen(latest()).includes(`${t.lead.name}:${a}`));
    expect(await leadTab1.emitWithAck('presence:viewing', { reviewId: t.reviewId, candidateId: b })).toEqual({
      ok: true,
    });
    await until(() => seen(latest()).includes(`${t.lead.name}:${b}`));
    expect(await reviewer.emitWithAck('presence:viewing', { reviewId: t.reviewId, candidateId: a })).toEqual({
      ok: true,
    });
    await until(() => seen(latest()).includes(`${t.reviewer.name}:${a}`));
    expect(seen(latest())).toEqual([`${t.lead.name}:${b}`, `${t.reviewer.name}:${a}`]);
    expect(latest()).toMatchObject({ reviewId: t.reviewId });
    // Back to the board as a whole.
    expect(await reviewer.emitWithAck('presence:viewing', { reviewId: t.reviewId, candidateId: null })).toEqual({
      ok: true,
    });
    await until(() => seen(latest()).includes(`${t.reviewer.name}:board`));

    // One tab closing keeps the person here (the other tab's view); the last one removes them.
    leadTab1.disconnect();
    await until(() => seen(latest()).includes(`${t.lead.name}:${a}`));
    expect(latest().people).toHaveLength(2);
    expect(await leadTab2.emitWithAck('review:leave', { reviewId: t.reviewId })).toEqual({ ok: true });
    await until(() => latest().people.length === 1);
    expect(seen(latest())).toEqual([`${t.reviewer.name}:board`]);
    reviewer.disconnect();
    leadTab2.disconnect();
  });
});

describe('Gather the room', () => {
  let t: BoardTeam;
  beforeAll(async () => {
    t = await boardTeam(ctx, server.baseURL, 'Gather');
  });

  it('the Lead gathers: everyone in the room is told; a Reviewer is refused; rejoining finds it; stop', async () => {
    const [a, b] = t.candidates;
    const lead = await onBoard(t.lead.cookie, t.reviewId);
    const engineer = await onBoard(t.engineer.cookie, t.reviewId);
    const reviewer = await onBoard(t.reviewer.cookie, t.reviewId);

    const toAll = [lead, engineer, reviewer].map((s) => next(s, 'room:gathered'));
    expect(await lead.emitWithAck('room:gather', { reviewId: t.reviewId, candidateId: a })).toEqual({ ok: true });
    for (const got of await Promise.all(toAll)) {
      expect(got).toEqual({ reviewId: t.reviewId, candidateId: a, by: { id: t.lead.id, name: t.lead.name } });
    }
    expect(await gatheringOf(ctx.db, t.reviewId)).toEqual({
      candidateId: a,
      by: { id: t.lead.id, name: t.lead.name },
    });

    for (const refused of [reviewer, engineer]) {
      expect(await refused.emitWithAck('room:gather', { reviewId: t.reviewId, candidateId: b })).toMatchObject({
        error: { code: 'forbidden' },
      });
    }
    // One gatherer at a time: the Owner may gather, but not while the Lead does and is here.
    const owner = await onBoard(t.owner.cookie, t.reviewId);
    const conflict = await owner.emitWithAck('room:gather', { reviewId: t.reviewId, candidateId: b });
    expect(conflict).toMatchObject({ error: { code: 'conflict' } });
    expect((conflict as { error: { message: string } }).error.message).toContain(t.lead.name);
    expect(await gatheringOf(ctx.db, t.reviewId)).toMatchObject({ candidateId: a, by: { id: t.lead.id } });

    // The Reviewer's connection drops; on rejoining they are sent to where the Lead is now.
    reviewer.disconnect();
    const moved = next(engineer, 'room:gathered');
    expect(await lead.emitWithAck('room:gather', { reviewId: t.reviewId, candidateId: b })).toEqual({ ok: true });
    expect(await moved).toMatchObject({ candidateId: b });
    const back = await open(t.reviewer.cookie);
    const sentOnJoin = next(back, 'room:gathered');
    expect(await back.emitWithAck('review:join', { reviewId: t.reviewId })).toEqual({ ok: true });
    expect(await sentOnJoin).toEqual({
      reviewId: t.reviewId,
      candidateId: b,
      by: { id: t.lead.id, name: t.lead.name },
    });
    expect(await gatheringOf(ctx.db, t.reviewId)).toMatchObject({ candidateId: b });

    // Stop: everyone is told, and nothing is gathered any more.
    const stopped = [engineer, back, owner].map((s) => next(s, 'room:gathered'));
    expect(await lead.emitWithAck('room:gather', { reviewId: t.reviewId, candidateId: null })).toEqual({ ok: true });
    for (const got of await Promise.all(stopped))
      expect(got).toMatchObject({ candidateId: null, by: { id: t.lead.id } });
    expect(await gatheringOf(ctx.db, t.reviewId)).toBeNull();
    // Now the Owner may gather.
    expect(await owner.emitWithAck('room:gather', { reviewId: t.reviewId, candidateId: a })).toEqual({ ok: true });
    expect(await gatheringOf(ctx.db, t.reviewId)).toMatchObject({ by: { id: t.owner.id } });
    expect(await owner.emitWithAck('room:gather', { reviewId: t.reviewId, candidateId: null })).toEqual({ ok: true });
    for (const s of [lead, engineer, back, owner]) s.disconnect();
  });

  it(
    'the gatherer gone from every socket ends the gathering after the grace; back in time keeps it',
    { timeout: 40_000 },
    async () => {
      const [a, b] = t.candidates;
      const reviewer = await onBoard(t.reviewer.cookie, t.reviewId);
      const gathered = heard(reviewer, 'room:gathered');
      let lead = await onBoard(t.lead.cookie, t.reviewId);
      expect(await lead.emitWithAck('room:gather', { reviewId: t.reviewId, candidateId: a })).toEqual({ ok: true });
      await until(() => gathered.length === 1);

      // A reload: gone, and back well within the grace.
      lead.disconnect();
      await new Promise((r) => setTimeout(r, 200));
      lead = await onBoard(t.lead.cookie, t.reviewId);
      await new Promise((r) => setTimeout(r, gatherGraceMs + 1_000));
      expect(await gatheringOf(ctx.db, t.reviewId)).toMatchObject({ candidateId: a, by: { id: t.lead.id } });
      // Then the Lead moves it, so the Reviewer's line shows nothing came in between.
      expect(await lead.emitWithAck('room:gather', { reviewId: t.reviewId, candidateId: b })).toEqual({ ok: true });
      await until(() => gathered.length === 2);
      expect(gathered.map((g) => g.candidateId)).toEqual([a, b]);

      // Gone for good: after the grace the room is told the gathering ended.
      const gatheredAt = Date.now();
      lead.disconnect();
      await until(() => gathered.length === 3);
      expect(Date.now() - gatheredAt).toBeGreaterThanOrEqual(gatherGraceMs - 100);
      expect(gathered[2]).toEqual({
        reviewId: t.reviewId,
        candidateId: null,
        by: { id: t.lead.id, name: t.lead.name },
      });
      expect(await gatheringOf(ctx.db, t.reviewId)).toBeNull();
      reviewer.disconnect();
    },
  );
});

describe('review news reaches its own room only', () => {
  it('a member of another Team, and a member on another board, never hear; a later event on the same connection proves it', async () => {
    const t = await boardTeam(ctx, server.baseURL, 'Heard');
    const other = await boardTeam(ctx, server.baseURL, 'Elsewhere');
    const secondReview = await addReview(t.lead, t.teamId, 'Heard second review');
    const [secondCandidate] = await addCandidates(ctx.db, secondReview, 1);

    const lead = await onBoard(t.lead.cookie, t.reviewId);
    // The outsider is on their own Team's board, and tries this one.
    const outsider = await onBoard(other.reviewer.cookie, other.reviewId);
    expect(await outsider.emitWithAck('review:join', { reviewId: t.reviewId })).toMatchObject({
      error: { code: 'not_found' },
    });
    // A member of the same Team on the other review's board.
    const neighbour = await onBoard(t.engineer.cookie, secondReview);
    const outsiderHeard = { gathered: heard(outsider, 'room:gathered'), presence: heard(outsider, 'presence:changed') };
    const neighbourHeard = {
      gathered: heard(neighbour, 'room:gathered'),
      presence: heard(neighbour, 'presence:changed'),
    };

    const leadHeard = next(lead, 'room:gathered');
    expect(await lead.emitWithAck('room:gather', { reviewId: t.reviewId, candidateId: t.candidates[0] })).toEqual({
      ok: true,
    });
    expect(await lead.emitWithAck('presence:viewing', { reviewId: t.reviewId, candidateId: t.candidates[1] })).toEqual({
      ok: true,
    });
    await leadHeard;
    await next(lead, 'presence:changed', (p) => p.people.some((x) => x.candidateId === t.candidates[1]));

    // News made through the API: a candidate added and edited on t's board.
    const outsiderCandidates = [heard(outsider, 'candidate:added'), heard(outsider, 'candidate:recomputed')];
    const neighbourCandidates = [heard(neighbour, 'candidate:added'), heard(neighbour, 'candidate:recomputed')];
    const added = next(lead, 'candidate:added');
    const made = await t.lead.agent
      .post(`/api/reviews/${t.reviewId}/candidates`)
      .send({ name: 'Heard only here', preset: 'regenerative' })
      .expect(201);
    await added;
    const recomputed = next(lead, 'candidate:recomputed', (p) => p.candidate.id === made.body.id);
    await t.lead.agent
      .patch(`/api/reviews/${t.reviewId}/candidates/${made.body.id}`)
      .send({ parameters: { compressor: { pressureRatio: 9 } } })
      .expect(200);
    await recomputed;

    // Later news each of them is owed, on the same connection: everything before it has arrived.
    const otherLead = await onBoard(other.lead.cookie, other.reviewId);
    expect(
      await otherLead.emitWithAck('room:gather', { reviewId: other.reviewId, candidateId: other.candidates[0] }),
    ).toEqual({ ok: true });
    const secondLead = await onBoard(t.lead.cookie, secondReview);
    expect(
      await secondLead.emitWithAck('room:gather', { reviewId: secondReview, candidateId: secondCandidate }),
    ).toEqual({ ok: true });
    await until(() => outsiderHeard.gathered.length > 0 && neighbourHeard.gathered.length > 0);

    expect([...outsiderCandidates, ...neighbourCandidates].flat()).toEqual([]);
    expect(outsiderHeard.gathered.map((g) => g.reviewId)).toEqual([other.reviewId]);
    expect(neighbourHeard.gathered.map((g) => g.reviewId)).toEqual([secondReview]);
    expect(outsiderHeard.presence.every((p) => p.reviewId === other.reviewId)).toBe(true);
    expect(neighbourHeard.presence.every((p) => p.reviewId === secondReview)).toBe(true);
    expect(neighbourHeard.presence.flatMap((p) => p.people.map((x) => x.candidateId))).not.toContain(t.candidates[1]);
  });

  it('a member removed from the Team stops hearing the board, and cannot come back', async () => {
    const t = await boardTeam(ctx, server.baseURL, 'Removed');
    const leaverTeam = await boardTeam(ctx, server.baseURL, 'Refuge');
    // The Reviewer of `t` is also the Owner of a Team of their own (the refuge's Owner).
    await ctx.auth.api.addMember({
      body: { userId: leaverTeam.owner.id, role: 'reviewer', organizationId: t.teamId },
    });
    const lead = await onBoard(t.lead.cookie, t.reviewId);
    const leaver = await onBoard(leaverTeam.owner.cookie, t.reviewId);
    expect(await leaver.emitWithAck('review:join', { reviewId: leaverTeam.reviewId })).toEqual({ ok: true });
    const first = next(leaver, 'room:gathered');
    expect(await lead.emitWithAck('room:gather', { reviewId: t.reviewId, candidateId: t.candidates[0] })).toEqual({
      ok: true,
    });
    expect(await first).toMatchObject({ reviewId: t.reviewId });

    await t.owner.agent
      .post('/api/auth/organization/remove-member')
      .send({ memberIdOrEmail: leaverTeam.owner.email, organizationId: t.teamId })
      .expect(200);
    const after = heard(leaver, 'room:gathered');
    const leadHeard = next(lead, 'room:gathered', (g) => g.candidateId === t.candidates[1]);
    expect(await lead.emitWithAck('room:gather', { reviewId: t.reviewId, candidateId: t.candidates[1] })).toEqual({
      ok: true,
    });
    await leadHeard;
    // News for the leaver's own Team's board, sent later on the same connection, marks the point.
    expect(
      await leaver.emitWithAck('room:gather', { reviewId: leaverTeam.reviewId, candidateId: leaverTeam.candidates[0] }),
    ).toEqual({ ok: true });
    await until(() => after.length > 0);
    expect(after.map((g) => g.reviewId)).toEqual([leaverTeam.reviewId]);
    // Nor are they on the board's presence any more, and they cannot come back.
    expect(await leaver.emitWithAck('review:join', { reviewId: t.reviewId })).toMatchObject({
      error: { code: 'not_found' },
    });
    expect(await leaver.emitWithAck('presence:viewing', { reviewId: t.reviewId, candidateId: null })).toMatchObject({
      error: { code: 'not_found' },
    });
    const presence = next(lead, 'presence:changed');
    expect(await lead.emitWithAck('presence:viewing', { reviewId: t.reviewId, candidateId: null })).toEqual({
      ok: true,
    });
    expect((await presence).people.map((p) => p.userId)).toEqual([t.lead.id]);
  });
});

describe('reconnecting', () => {
  it('disconnect, reconnect, join again: the same board state', async () => {
    const t = await boardTeam(ctx, server.baseURL, 'Reconnect');
    const lead = await onBoard(t.lead.cookie, t.reviewId);
    expect(await lead.emitWithAck('room:gather', { reviewId: t.reviewId, candidateId: t.candidates[2] })).toEqual({
      ok: true,
    });
    const reviewer = await onBoard(t.reviewer.cookie, t.reviewId);
    const before = await next(lead, 'presence:changed', (p) => p.people.length === 2);

    // The same client object reconnects (as the app's socket does after a network drop).
    const dropped = next(lead, 'presence:changed', (p) => p.people.length === 1);
    reviewer.disconnect();
    await dropped;
    reviewer.connect();
    await new Promise<void>((resolve) => reviewer.once('connect', () => resolve()));
    const gathered = next(reviewer, 'room:gathered');
    const presence = next(reviewer, 'presence:changed', (p) => p.people.length === 2);
    expect(await reviewer.emitWithAck('review:join', { reviewId: t.reviewId })).toEqual({ ok: true });
    expect(await gathered).toEqual({
      reviewId: t.reviewId,
      candidateId: t.candidates[2],
      by: { id: t.lead.id, name: t.lead.name },
    });
    expect((await presence).people).toEqual(before.people);
    expect(await gatheringOf(ctx.db, t.reviewId)).toMatchObject({ candidateId: t.candidates[2] });
  });
});
