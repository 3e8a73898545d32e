import { and, eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { activity, ballot, round } from '@/db/schema';
import type { Round } from '@/server/contracts/board';
import { teamRoles, type TeamRole } from '@/server/contracts/roles';
import { currentRound } from '@/server/services/rounds';

import { createTestApp, type TestUser } from '../helpers/api';
import { addCandidates, discussionTeam, type DiscussionTeam } from './fixtures/discussion';

const ctx = createTestApp();
let t: DiscussionTeam;
let other: DiscussionTeam;

beforeAll(async () => {
  t = await discussionTeam(ctx, 'Rhona');
  other = await discussionTeam(ctx, 'Piet', 2);
});
afterAll(() => ctx.close());

const base = () => `/api/reviews/${t.reviewId}/rounds`;
const open = (by: TestUser, body: object = { votesPerPerson: 3, blind: false }) => by.agent.post(base()).send(body);
const vote = (by: TestUser, roundId: string, votes: Record<string, number>) =>
  by.agent.put(`${base()}/${roundId}/ballot`).send({ votes });
const close = (by: TestUser, roundId: string) => by.agent.post(`${base()}/${roundId}/close`).send({});
const ballotsOf = (roundId: string) => ctx.db.select().from(ballot).where(eq(ballot.roundId, roundId));

/** Each test leaves no round open behind it. */
async function closeAnyOpen() {
  const [row] = await ctx.db
    .select()
    .from(round)
    .where(and(eq(round.reviewId, t.reviewId), eq(round.status, 'open')));
  if (row) await close(t.lead, row.id).expect(200);
}

/** What the room was last told of `event`, as a listener with `role` hears it. */
function lastTold(event: string, role: TeamRole, userId = 'someone'): Round {
  const sent = ctx.sent.filter((s) => s.reviewId === t.reviewId && s.event === event).at(-1);
  if (!sent) throw new Error(`nothing told as ${event}`);
  const payload = sent.payload as Round | ((l: { userId: string; role: string }) => { round: Round });
  if (typeof payload !== 'function') throw new Error(`${event} is not made per listener`);
  return payload({ userId, role }).round;
}

describe('a preference round from opening to closing', () => {
  it('opens, takes ballots, closes with its tally and stays readable', async () => {
    const opened = await open(t.lead);
    expect(opened.status).toBe(201);
    const roundId = opened.body.id as string;
    expect(opened.body).toMatchObject({
      number: 1,
      status: 'open',
      votesPerPerson: 3,
      blind: false,
      voters: 0,
      votedBy: [],
      myBallot: null,
      closedAt: null,
    });
    // Every candidate of the review is in the tally, 0 included.
    expect(opened.body.tally).toEqual(Object.fromEntries(t.candidates.map((id) => [id, 0])));

    const [a, b, c] = t.candidates;
    const engineer = await vote(t.engineer, roundId, { [a]: 2, [b]: 1 });
    expect(engineer.status).toBe(200);
    expect(engineer.body.myBallot).toEqual({ [a]: 2, [b]: 1 });
    expect(engineer.body.tally).toEqual({ [a]: 2, [b]: 1, [c]: 0 });
    expect(engineer.body.voters).toBe(1);
    expect(engineer.body.votedBy).toBeNull(); // only the Lead and Owner see who

    const reviewer = await vote(t.reviewer, roundId, { [c]: 3 });
    expect(reviewer.body.tally).toEqual({ [a]: 2, [b]: 1, [c]: 3 });
    const lead = await vote(t.lead, roundId, { [a]: 1 });
    expect(lead.body.voters).toBe(3);
    expect(lead.body.votedBy.map((p: { name: string }) => p.name).sort()).toEqual(
      [t.engineer.name, t.lead.name, t.reviewer.name].sort(),
    );

    const closed = await close(t.lead, roundId);
    expect(closed.status).toBe(200);
    expect(closed.body).toMatchObject({ status: 'closed', voters: 3, tally: { [a]: 3, [b]: 1, [c]: 3 } });
    expect(closed.body.myBallot).toEqual({ [a]: 1 });
    expect(Date.parse(closed.body.closedAt)).toBeGreaterThanOrEqual(Date.parse(closed.body.openedAt));

    const again = await open(t.owner, { votesPerPerson: 2, blind: true });
    expect(again.status).toBe(201);
    expect(again.body.number).toBe(2);

    const list = await t.observer.agent.get(base());
    expect(list.status).toBe(200);
    expect(list.body.map((r: Round) => [r.number, r.status])).toEqual([
      [1, 'closed'],
      [2, 'open'],
    ]);
    expect(list.body[0].tally).toEqual({ [a]: 3, [b]: 1, [c]: 3 });
    expect(list.body[0].myBallot).toBeNull();

    const logged = await ctx.db.select().from(activity).where(eq(activity.reviewId, t.reviewId));
    const roundLines = logged.filter((l) => l.kind.startsWith('round:'));
    expect(roundLines.map((l) => [l.kind, l.detail.number])).toEqual([
      ['round:opened', 1],
      ['round:closed', 1],
      ['round:opened', 2],
    ]);
    expect(roundLines[0].detail.reviewName).toBe('Rhona review');
    await closeAnyOpen();
  });

  it('tells the room after each change, the Lead with who voted and nobody with a ballot', async () => {
    const roundId = (await open(t.lead)).body.id as string;
    expect(lastTold('round:opened', 'reviewer').id).toBe(roundId);
    await vote(t.engineer, roundId, { [t.candidates[0]]: 1 }).expect(200);
    const toLead = lastTold('round:tallied', 'lead', t.engineer.id);
    const toOwner = lastTold('round:tallied', 'owner');
    const toReviewer = lastTold('round:tallied', 'reviewer');
    expect(toLead.votedBy).toEqual([{ id: t.engineer.id, name: t.engineer.name }]);
    expect(toOwner.votedBy).toEqual([{ id: t.engineer.id, name: t.engineer.name }]);
    expect(toReviewer.votedBy).toBeNull();
    expect(toReviewer.voters).toBe(1);
    // Even the voter's own listener gets no ballot in a broadcast: the client keeps its PUT's.
    expect(toLead.myBallot).toBeNull();
    await close(t.lead, roundId).expect(200);
    expect(lastTold('round:closed', 'engineer').status).toBe('closed');
  });

  it('refuses a second open round with 409 and leaves the first as it was', async () => {
    const first = await open(t.lead);
    const second = await open(t.owner, { votesPerPerson: 5, blind: true });
    expect(second.status).toBe(409);
    expect(second.body.error.code).toBe('round_open');
    const rows = await ctx.db
      .select()
      .from(round)
      .where(and(eq(round.reviewId, t.reviewId), eq(round.status, 'open')));
    expect(rows.map((r) => [r.id, r.votesPerPerson])).toEqual([[first.body.id, 3]]);
    await closeAnyOpen();
  });

  it('opens one round when two Leads press at the same moment', async () => {
    const answers = await Promise.all([open(t.lead), open(t.owner), open(t.lead), open(t.owner)]);
    expect(answers.map((r) => r.status).sort()).toEqual([201, 409, 409, 409]);
    await closeAnyOpen();
  });

  it('refuses closing a closed round', async () => {
    const roundId = (await open(t.lead)).body.id as string;
    await close(t.lead, roundId).expect(200);
    const again = await close(t.lead, roundId);
    expect(again.status).toBe(409);
    expect(again.body.error.code).toBe('round_closed');
  });
});

describe('ballots', () => {
  it('refuses a ballot that spends more votes than allowed, naming votes, and stores nothing', async () => {
    const roundId = (await open(t.lead)).body.id as string;
    const [a, b] = t.candidates;
    const res = await vote(t.reviewer, roundId, { [a]: 2, [b]: 2 });
    expect(res.status).toBe(422);
    expect(res.body.error.field).toBe('votes');
    expect(res.body.error.message).toContain('spends 4 votes');
    expect(res.body.error.message).toContain('allows 3');
    expect(await ballotsOf(roundId)).toEqual([]);

    // An earlier ballot survives an over-spent change untouched.
    await vote(t.reviewer, roundId, { [a]: 3 }).expect(200);
    expect((await vote(t.reviewer, roundId, { [a]: 3, [b]: 1 })).status).toBe(422);
    expect((await ballotsOf(roundId)).map((r) => r.votes)).toEqual([{ [a]: 3 }]);
    await closeAnyOpen();
  });

  it('refuses a ballot naming a candidate of another review (or none at all), storing nothing', async () => {
    const roundId = (await open(t.lead)).body.id as string;
    const foreign = other.candidates[0];
    const res = await vote(t.engineer, roundId, { [t.candidates[0]]: 1, [foreign]: 1 });
    expect(res.status).toBe(422);
    expect(res.body.error.field).toBe(`votes.${foreign}`);
    expect(res.body.error.message).toContain('not a candidate of this Review');
    const made = await vote(t.engineer, roundId, { 'not-a-candidate': 1 });
    expect(made.status).toBe(422);
    expect(made.body.error.field).toBe('votes.not-a-candidate');
    expect(await ballotsOf(roundId)).toEqual([]);
    await closeAnyOpen();
  });

  it('keeps one ballot per person: a change replaces it, an empty one withdraws it', async () => {
    const roundId = (await open(t.lead)).body.id as string;
    const [a, b] = t.candidates;
    await vote(t.engineer, roundId, { [a]: 3 }).expect(200);
    const changed = await vote(t.engineer, roundId, { [a]: 0, [b]: 2 });
    expect(changed.status).toBe(200);
    expect(changed.body.myBallot).toEqual({ [b]: 2 });
    expect(changed.body.tally[a]).toBe(0);
    expect(changed.body.tally[b]).toBe(2);
    expect(changed.body.voters).toBe(1);
    const rows = await ballotsOf(roundId);
    expect(rows).toHaveLength(1);
    expect(rows[0]).toMatchObject({ userId: t.engineer.id, votes: { [b]: 2 } });

    // Many changes at once from one person still leave one ballot, one of those sent.
    const sent = [1, 2, 3].map((n) => ({ [a]: n }));
    await Promise.all(sent.map((v) => vote(t.engineer, roundId, v).expect(200)));
    const after = await ballotsOf(roundId);
    expect(after).toHaveLength(1);
    expect(sent).toContainEqual(after[0].votes);

    const withdrawn = await vote(t.engineer, roundId, {});
    expect(withdrawn.body).toMatchObject({ voters: 0, myBallot: null });
    expect(await ballotsOf(roundId)).toEqual([]);
    await closeAnyOpen();
  });

  it('refuses a ballot once the round is closed, with 409, and stores nothing', async () => {
    const roundId = (await open(t.lead)).body.id as string;
    await close(t.lead, roundId).expect(200);
    const res = await vote(t.reviewer, roundId, { [t.candidates[0]]: 1 });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('round_closed');
    expect(await ballotsOf(roundId)).toEqual([]);
  });

  it('a ballot racing the close lands before it or is refused, never after', async () => {
    const [a] = t.candidates;
    let landed = 0;
    let refused = 0;
    for (let i = 0; i < 12; i++) {
      const roundId = (await open(t.lead)).body.id as string;
      // supertest sends on `then`: the ballot goes first half the time, the close the other half.
      const ballotSent = vote(t.reviewer, roundId, { [a]: 1 });
      const closeSent = close(t.lead, roundId);
      const [ballotRes, closeRes] =
        i % 2 === 0
          ? await Promise.all([ballotSent, closeSent])
          : await Promise.all([closeSent, ballotSent]).then(([c, b]) => [b, c] as const);
      expect(closeRes.status).toBe(200);
      const stored = await ballotsOf(roundId);
      const [closedRow] = await ctx.db.select().from(round).where(eq(round.id, roundId));
      if (ballotRes.status === 200) {
        landed++;
        // What the close reported includes it, and it was stored no later than the close.
        expect(closeRes.body.tally[a]).toBe(1);
        expect(closeRes.body.voters).toBe(1);
        expect(stored).toHaveLength(1);
        expect(stored[0].updatedAt.getTime()).toBeLessThanOrEqual(closedRow.closedAt!.getTime());
      } else {
        refused++;
        expect(ballotRes.status).toBe(409);
        expect(closeRes.body.tally[a]).toBe(0);
        expect(stored).toEqual([]);
      }
    }
    expect(landed + refused).toBe(12);
  });
});

describe('a blind round', () => {
  it('hides the tally from everyone until it closes, and shows who voted to the Lead and Owner only', async () => {
    const opened = await open(t.lead, { votesPerPerson: 2, blind: true });
    expect(opened.body.tally).toBeNull();
    const roundId = opened.body.id as string;
    const [a, b] = t.candidates;
    const mine = await vote(t.engineer, roundId, { [a]: 2 });
    expect(mine.body.tally).toBeNull();
    expect(mine.body.myBallot).toEqual({ [a]: 2 }); // one's own ballot, of course
    await vote(t.lead, roundId, { [b]: 1 }).expect(200);

    for (const role of teamRoles) {
      const seen = (await t[role].agent.get(base())).body.at(-1) as Round;
      expect(seen.id).toBe(roundId);
      expect(seen.tally, role).toBeNull();
      expect(seen.voters, role).toBe(2);
      if (role === 'lead' || role === 'owner') {
        expect(seen.votedBy, role).toEqual(
          [
            { id: t.engineer.id, name: t.engineer.name },
            { id: t.lead.id, name: t.lead.name },
          ].sort((x, y) => x.name.localeCompare(y.name)),
        );
      } else {
        expect(seen.votedBy, role).toBeNull();
      }
      // Nobody's ballot but one's own, in any form: the Engineer voted for a alone, the Lead for b.
      expect(seen.myBallot, role).toEqual(role === 'engineer' ? { [a]: 2 } : role === 'lead' ? { [b]: 1 } : null);
      if (role !== 'engineer') expect(JSON.stringify(seen), role).not.toContain(a);
      if (role !== 'lead') expect(JSON.stringify(seen), role).not.toContain(b);
      // The room hears it the same way.
      expect(lastTold('round:tallied', role).tally, role).toBeNull();
    }

    const closed = await close(t.lead, roundId);
    expect(closed.body.tally).toEqual({ [a]: 2, [b]: 1, [t.candidates[2]]: 0 });
    for (const role of teamRoles) {
      expect((await t[role].agent.get(base())).body.at(-1).tally, role).toEqual(closed.body.tally);
      expect(lastTold('round:closed', role).tally, role).toEqual(closed.body.tally);
    }
  });
});

describe('currentRound (what the board shows)', () => {
  it('is the open round, else the latest closed one, else null', async () => {
    const fresh = await discussionTeam(ctx, 'Quinn', 1);
    const asLead = { userId: fresh.lead.id, role: 'lead' as const };
    expect(await currentRound(ctx.db, fresh.reviewId, asLead)).toBeNull();
    const path = `/api/reviews/${fresh.reviewId}/rounds`;
    const first = (await fresh.lead.agent.post(path).send({ votesPerPerson: 1, blind: false })).body as Round;
    expect((await currentRound(ctx.db, fresh.reviewId, asLead))?.id).toBe(first.id);
    await fresh.lead.agent.post(`${path}/${first.id}/close`).send({}).expect(200);
    const second = (await fresh.lead.agent.post(path).send({ votesPerPerson: 1, blind: false })).body as Round;
    expect((await currentRound(ctx.db, fresh.reviewId, asLead))?.id).toBe(second.id);
    await fresh.lead.agent.post(`${path}/${second.id}/close`).send({}).expect(200);
    const latest = await currentRound(ctx.db, fresh.reviewId, asLead);
    expect(latest).toMatchObject({ id: second.id, status: 'closed', number: 2 });

    // A candidate added after the round closed appears in its tally with 0.
    const [late] = await addCandidates(ctx.db, fresh.reviewId, 1, 1);
    expect((await currentRound(ctx.db, fresh.reviewId, asLead))?.tally?.[late]).toBe(0);
  });
});
