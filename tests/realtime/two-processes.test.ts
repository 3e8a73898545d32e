import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import type { ReviewNews } from '@/server/contracts/news';

import { createTestApp } from '../helpers/api';
import { startTestServer } from '../helpers/test-server';
import {
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

/**
 * Two servers on one database, as `npm start` and `PORT=8091 npm start` are: rooms, broadcasts
 * and fetchSockets span both through the Postgres adapter. Each server has its own pool, its
 * own socket.io and its own adapter; they share nothing but Postgres.
 */

let one: Awaited<ReturnType<typeof startTestServer>>;
let two: Awaited<ReturnType<typeof startTestServer>>;
let ctx: ReturnType<typeof createTestApp>;
let t: BoardTeam;
let stopped = false;
const sockets: Client[] = [];

beforeAll(async () => {
  [one, two] = await Promise.all([startTestServer(), startTestServer()]);
  ctx = createTestApp();
  t = await boardTeam(ctx, one.baseURL, 'Twofold');
});
afterAll(async () => {
  for (const s of sockets) s.disconnect();
  await Promise.all([one?.stop(), stopped ? undefined : two?.stop()]);
  await ctx.close();
});

const onBoard = (server: typeof one, cookie: string) => joinBoard(server.baseURL, cookie, t.reviewId, sockets);

describe('two server processes on one database', () => {
  let lead: Client;
  let reviewer: Client;
  let engineer: Client;
  let reviewerPresence: Array<ReviewNews['presence:changed']>;

  it('presence spans both: people on either process are on everyone’s list', async () => {
    lead = await onBoard(one, t.lead.cookie);
    reviewer = await onBoard(two, t.reviewer.cookie);
    reviewerPresence = heard(reviewer, 'presence:changed');
    const latest = () => reviewerPresence[reviewerPresence.length - 1];
    engineer = await onBoard(two, t.engineer.cookie);
    // The processes find each other by heartbeat within seconds of starting; the list then holds all three.
    const everyone = [t.engineer.name, t.lead.name, t.reviewer.name].map((n) => `${n}:board`);
    await until(() => latest() !== undefined && seen(latest()).join() === everyone.join());
    const onOne = next(lead, 'presence:changed', (p) => p.people.some((x) => x.candidateId === t.candidates[1]));
    expect(
      await reviewer.emitWithAck('presence:viewing', { reviewId: t.reviewId, candidateId: t.candidates[1] }),
    ).toEqual({
      ok: true,
    });
    expect(seen(await onOne)).toEqual([
      `${t.engineer.name}:board`,
      `${t.lead.name}:board`,
      `${t.reviewer.name}:${t.candidates[1]}`,
    ]);
  });

  it('a gathering made on one process reaches the clients of the other, and is refused there for a second gatherer', async () => {
    const onTwo = [reviewer, engineer].map((s) => next(s, 'room:gathered'));
    expect(await lead.emitWithAck('room:gather', { reviewId: t.reviewId, candidateId: t.candidates[0] })).toEqual({
      ok: true,
    });
    for (const got of await Promise.all(onTwo)) {
      expect(got).toEqual({
        reviewId: t.reviewId,
        candidateId: t.candidates[0],
        by: { id: t.lead.id, name: t.lead.name },
      });
    }
    // The Owner on the other process: the Lead is on the board (on process one), so no takeover.
    const owner = await onBoard(two, t.owner.cookie);
    expect(
      await owner.emitWithAck('room:gather', { reviewId: t.reviewId, candidateId: t.candidates[1] }),
    ).toMatchObject({
      error: { code: 'conflict' },
    });
    // A client joining on the other process goes where the Lead is.
    const late = await openClient(two.baseURL, t.observer.cookie, sockets);
    const sent = next(late, 'room:gathered');
    expect(await late.emitWithAck('review:join', { reviewId: t.reviewId })).toEqual({ ok: true });
    expect(await sent).toMatchObject({ candidateId: t.candidates[0] });
  });

  it('news from an API request on one process reaches a client of the other', async () => {
    // Team news (review:created) goes through the same fetchSockets-and-check path as the board's.
    const teamSocket = await openClient(two.baseURL, t.reviewer.cookie, sockets);
    expect(await teamSocket.emitWithAck('team:join', { teamId: t.teamId })).toEqual({ ok: true });
    const created = new Promise<{ review: { name: string } }>((resolve) => teamSocket.once('review:created', resolve));
    await t.lead.agent.post(`/api/teams/${t.teamId}/reviews`).send({ name: 'Made on process one' }).expect(201);
    expect((await created).review.name).toBe('Made on process one');
  });

  it('a candidate added and edited through the API on one process reaches the board on the other', async () => {
    const added = next(reviewer, 'candidate:added', (p) => p.candidate.name === 'Across processes');
    const res = await t.lead.agent
      .post(`/api/reviews/${t.reviewId}/candidates`)
      .send({ name: 'Across processes', preset: 'simple' })
      .expect(201);
    expect((await added).candidate).toMatchObject({ id: res.body.id, revision: res.body.revision });

    const recomputed = [reviewer, engineer].map((s) =>
      next(s, 'candidate:recomputed', (p) => p.candidate.id === res.body.id),
    );
    const edited = await t.lead.agent
      .patch(`/api/reviews/${t.reviewId}/candidates/${res.body.id}`)
      .send({ parameters: { compressor: { pressureRatio: 17 } } })
      .expect(200);
    for (const got of await Promise.all(recomputed)) {
      expect(got.candidate.revision).toBe(edited.body.revision);
      expect(got.candidate.parameters).toMatchObject({ compressor: { pressureRatio: 17 } });
    }
  });

  it('when one process stops, the other goes on at once, and its clients come back to the same state', async () => {
    await two.stop();
    stopped = true;
    // The stopping process told the other it left, so nothing waits for its answer.
    const started = performance.now();
    const alone = next(lead, 'presence:changed', (p) => p.people.every((x) => x.userId === t.lead.id));
    expect(await lead.emitWithAck('presence:viewing', { reviewId: t.reviewId, candidateId: t.candidates[2] })).toEqual({
      ok: true,
    });
    expect((await alone).people).toEqual([
      { userId: t.lead.id, name: t.lead.name, role: 'lead', candidateId: t.candidates[2] },
    ]);
    expect(performance.now() - started).toBeLessThan(1_000);

    // The Reviewer's client reconnects to the process still up: the gathering is where it was.
    const back = await openClient(one.baseURL, t.reviewer.cookie, sockets);
    const gathered = next(back, 'room:gathered');
    const presence = next(back, 'presence:changed', (p) => p.people.length === 2);
    expect(await back.emitWithAck('review:join', { reviewId: t.reviewId })).toEqual({ ok: true });
    expect(await gathered).toMatchObject({ candidateId: t.candidates[0], by: { id: t.lead.id } });
    expect(seen(await presence)).toEqual([`${t.lead.name}:${t.candidates[2]}`, `${t.reviewer.name}:board`]);
  });
});
