import { io as connect } from 'socket.io-client';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { gatheringOf } from '@/server/services/live';

import { createTestApp } from '../helpers/api';
import { startTestServer } from '../helpers/test-server';
import {
  addCandidates,
  addReview,
  boardTeam,
  heard,
  next,
  openClient,
  until,
  type AckResult,
  type BoardTeam,
  type Client,
} from '../realtime/live-fixture';

/**
 * The review board's socket events as an attacker sends them: another Team's ids, a lower
 * role, malformed and oversized payloads, events before joining, and candidates of another
 * review. Each is refused with a clear code and changes nothing.
 */

let server: Awaited<ReturnType<typeof startTestServer>>;
let ctx: ReturnType<typeof createTestApp>;
let t: BoardTeam;
let other: BoardTeam;
/** A second review of t's own Team, with a candidate of its own. */
let sibling: { reviewId: string; candidateId: string };
const sockets: Client[] = [];
const open = (cookie?: string) => openClient(server.baseURL, cookie, sockets);

beforeAll(async () => {
  server = await startTestServer();
  ctx = createTestApp();
  t = await boardTeam(ctx, server.baseURL, 'Guarded');
  other = await boardTeam(ctx, server.baseURL, 'Prowler');
  const reviewId = await addReview(t.lead, t.teamId, 'Guarded sibling');
  sibling = { reviewId, candidateId: (await addCandidates(ctx.db, reviewId, 1))[0] };
});
afterAll(async () => {
  for (const s of sockets) s.disconnect();
  await server.stop();
  await ctx.close();
});

const code = (result: AckResult) => ('error' in result ? result.error.code : 'ok');

describe('another Team’s review', () => {
  it('every event naming another Team’s review is not found, even from an Owner of their own Team', async () => {
    // The other Team's Owner (every permission in their own Team) against t's review.
    const prowler = await open(other.owner.cookie);
    const target = { reviewId: t.reviewId };
    expect(await prowler.emitWithAck('review:join', target)).toMatchObject({
      error: { code: 'not_found', message: 'The Review was not found.' },
    });
    expect(await prowler.emitWithAck('presence:viewing', { ...target, candidateId: null })).toMatchObject({
      error: { code: 'not_found' },
    });
    expect(await prowler.emitWithAck('room:gather', { ...target, candidateId: t.candidates[0] })).toMatchObject({
      error: { code: 'not_found' },
    });
    // Ids that are not ids, and ids of nothing, answer the same.
    for (const reviewId of ['not-a-uuid', '00000000-0000-4000-8000-000000000000', "' or 1=1 --"]) {
      expect(code(await prowler.emitWithAck('review:join', { reviewId }))).toBe('not_found');
    }
    expect(await gatheringOf(ctx.db, t.reviewId)).toBeNull();
  });

  it('joining one’s own review and then naming another Team’s candidate is refused', async () => {
    const prowler = await open(other.lead.cookie);
    expect(await prowler.emitWithAck('review:join', { reviewId: other.reviewId })).toEqual({ ok: true });
    for (const event of ['presence:viewing', 'room:gather'] as const) {
      expect(
        await prowler.emitWithAck(event, { reviewId: other.reviewId, candidateId: t.candidates[0] }),
      ).toMatchObject({ error: { code: 'not_found', field: 'candidateId' } });
    }
    expect(await gatheringOf(ctx.db, other.reviewId)).toBeNull();
  });
});

describe('no session, a foreign Origin', () => {
  it('no handshake, so no event reaches a handler', async () => {
    await expect(open(undefined)).rejects.toThrow(/unauthorized/);
    const foreign = connect(server.baseURL, {
      transports: ['websocket'],
      extraHeaders: { cookie: t.lead.cookie, origin: 'https://evil.example' },
      reconnection: false,
    });
    sockets.push(foreign);
    await expect(
      new Promise((resolve, reject) => {
        foreign.once('connect', () => resolve(true));
        foreign.once('connect_error', reject);
      }),
    ).rejects.toThrow();
  });
});

describe('a lower role', () => {
  it('Engineers, Reviewers and Observers may not gather, nor stop a gathering', async () => {
    const lead = await open(t.lead.cookie);
    expect(await lead.emitWithAck('review:join', { reviewId: t.reviewId })).toEqual({ ok: true });
    for (const role of ['engineer', 'reviewer', 'observer'] as const) {
      const socket = await open(t[role].cookie);
      expect(await socket.emitWithAck('review:join', { reviewId: t.reviewId })).toEqual({ ok: true });
      const refused = await socket.emitWithAck('room:gather', { reviewId: t.reviewId, candidateId: t.candidates[0] });
      expect(refused).toMatchObject({ error: { code: 'forbidden' } });
    }
    expect(await gatheringOf(ctx.db, t.reviewId)).toBeNull();
    expect(await lead.emitWithAck('room:gather', { reviewId: t.reviewId, candidateId: t.candidates[0] })).toEqual({
      ok: true,
    });
    const reviewer = await open(t.reviewer.cookie);
    expect(await reviewer.emitWithAck('review:join', { reviewId: t.reviewId })).toEqual({ ok: true });
    expect(await reviewer.emitWithAck('room:gather', { reviewId: t.reviewId, candidateId: null })).toMatchObject({
      error: { code: 'forbidden' },
    });
    expect(await gatheringOf(ctx.db, t.reviewId)).toMatchObject({ by: { id: t.lead.id } });
    expect(await lead.emitWithAck('room:gather', { reviewId: t.reviewId, candidateId: null })).toEqual({ ok: true });
  });
});

describe('malformed payloads', () => {
  const malformed: Array<[string, unknown]> = [
    ['no payload', undefined],
    ['null', null],
    ['a string', 'review'],
    ['an array', [{ reviewId: 'x' }]],
    ['an empty object', {}],
    ['a number for reviewId', { reviewId: 42 }],
    ['an empty reviewId', { reviewId: '' }],
    ['a long reviewId', { reviewId: 'r'.repeat(101) }],
    ['an extra field', { reviewId: '00000000-0000-4000-8000-000000000000', admin: true }],
    ['an object for reviewId', { reviewId: { $ne: null } }],
  ];
  for (const [what, payload] of malformed) {
    it(`${what}: invalid_input for every event, nothing joined`, async () => {
      const socket = await open(t.lead.cookie);
      for (const event of ['review:join', 'review:leave', 'presence:viewing', 'room:gather'] as const) {
        const result = (await (socket.emitWithAck as (e: string, p: unknown) => Promise<AckResult>)(
          event,
          payload,
        )) as AckResult;
        expect(result, event).toMatchObject({ error: { code: 'invalid_input' } });
      }
    });
  }

  it('candidateId missing, a number, or too long: invalid_input naming it', async () => {
    const socket = await open(t.lead.cookie);
    expect(await socket.emitWithAck('review:join', { reviewId: t.reviewId })).toEqual({ ok: true });
    for (const event of ['presence:viewing', 'room:gather'] as const) {
      for (const candidateId of [undefined, 7, 'c'.repeat(101), ['x']]) {
        const result = await (socket.emitWithAck as (e: string, p: unknown) => Promise<AckResult>)(event, {
          reviewId: t.reviewId,
          candidateId,
        });
        expect(result).toMatchObject({
          error: { code: 'invalid_input', message: expect.stringMatching(/candidateId/) },
        });
      }
    }
    expect(await gatheringOf(ctx.db, t.reviewId)).toBeNull();
  });
});

describe('a candidate of another review', () => {
  it('viewing or gathering to a candidate of a sibling review is refused, and the room hears nothing', async () => {
    const lead = await open(t.lead.cookie);
    const reviewer = await open(t.reviewer.cookie);
    for (const s of [lead, reviewer]) {
      expect(await s.emitWithAck('review:join', { reviewId: t.reviewId })).toEqual({ ok: true });
    }
    const reviewerPresence = heard(reviewer, 'presence:changed');
    const reviewerGathered = heard(reviewer, 'room:gathered');
    const wrong = { reviewId: t.reviewId, candidateId: sibling.candidateId };
    for (const who of [lead, reviewer]) {
      expect(await who.emitWithAck('presence:viewing', wrong)).toMatchObject({
        error: { code: 'not_found', field: 'candidateId' },
      });
    }
    expect(await lead.emitWithAck('room:gather', wrong)).toMatchObject({
      error: { code: 'not_found', field: 'candidateId' },
    });
    for (const candidateId of ['not-a-uuid', '00000000-0000-4000-8000-000000000000']) {
      expect(code(await lead.emitWithAck('presence:viewing', { reviewId: t.reviewId, candidateId }))).toBe('not_found');
    }
    expect(await gatheringOf(ctx.db, t.reviewId)).toBeNull();
    // A real change afterwards: the only news heard is that one.
    const marker = next(reviewer, 'presence:changed', (p) => p.people.some((x) => x.candidateId === t.candidates[1]));
    const before = reviewerPresence.length;
    expect(await lead.emitWithAck('presence:viewing', { reviewId: t.reviewId, candidateId: t.candidates[1] })).toEqual({
      ok: true,
    });
    await marker;
    expect(reviewerPresence.slice(before).flatMap((p) => p.people.map((x) => x.candidateId))).not.toContain(
      sibling.candidateId,
    );
    expect(reviewerGathered).toEqual([]);
  });
});

describe('events before joining', () => {
  it('presence:viewing and room:gather before review:join are refused with not_joined', async () => {
    const lead = await open(t.lead.cookie);
    expect(await lead.emitWithAck('presence:viewing', { reviewId: t.reviewId, candidateId: null })).toMatchObject({
      error: { code: 'not_joined' },
    });
    expect(await lead.emitWithAck('room:gather', { reviewId: t.reviewId, candidateId: t.candidates[0] })).toMatchObject(
      { error: { code: 'not_joined' } },
    );
    // Joined to a sibling review is not joined to this one.
    expect(await lead.emitWithAck('review:join', { reviewId: sibling.reviewId })).toEqual({ ok: true });
    expect(await lead.emitWithAck('room:gather', { reviewId: t.reviewId, candidateId: t.candidates[0] })).toMatchObject(
      { error: { code: 'not_joined' } },
    );
    // After leaving, too.
    expect(await lead.emitWithAck('review:join', { reviewId: t.reviewId })).toEqual({ ok: true });
    expect(await lead.emitWithAck('review:leave', { reviewId: t.reviewId })).toEqual({ ok: true });
    expect(await lead.emitWithAck('presence:viewing', { reviewId: t.reviewId, candidateId: null })).toMatchObject({
      error: { code: 'not_joined' },
    });
    expect(await gatheringOf(ctx.db, t.reviewId)).toBeNull();
  });
});

describe('oversized payloads', () => {
  it('a message over 64 kB closes that socket; the server goes on serving', async () => {
    const socket = await open(t.lead.cookie);
    const closed = new Promise<string>((resolve) => socket.once('disconnect', resolve));
    socket.emit('review:join', { reviewId: 'r'.repeat(70 * 1024) });
    expect(await closed).toBe('transport close');
    expect((await fetch(`${server.baseURL}/api/health`)).status).toBe(200);
    const fresh = await open(t.lead.cookie);
    expect(await fresh.emitWithAck('review:join', { reviewId: t.reviewId })).toEqual({ ok: true });
  });

  it('a large payload under the cap is refused by the schema, naming the field', async () => {
    const socket = await open(t.lead.cookie);
    expect(await socket.emitWithAck('review:join', { reviewId: 'r'.repeat(60 * 1024) })).toMatchObject({
      error: { code: 'invalid_input', message: expect.stringMatching(/reviewId/) },
    });
    const viewing = await socket.emitWithAck('presence:viewing', {
      reviewId: t.reviewId,
      candidateId: 'c'.repeat(60 * 1024),
    });
    expect(viewing).toMatchObject({ error: { code: 'invalid_input', message: expect.stringMatching(/candidateId/) } });
    expect(socket.connected).toBe(true);
  });
});

describe('a flood of board events', () => {
  it('presence:viewing past the per-socket allowance is refused before any database work', async () => {
    const socket = await open(t.engineer.cookie);
    expect(await socket.emitWithAck('review:join', { reviewId: t.reviewId })).toEqual({ ok: true });
    const acks: AckResult[] = [];
    for (let i = 0; i < 200; i++) {
      socket.emit('presence:viewing', { reviewId: t.reviewId, candidateId: null }, (r: AckResult) => void acks.push(r));
    }
    await until(() => acks.length >= 100 || !socket.connected);
    expect(acks.some((a) => code(a) === 'rate_limited')).toBe(true);
  });
});
