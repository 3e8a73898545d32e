import { io as connect, type Socket } from 'socket.io-client';
import { afterAll, beforeAll, expect } from 'vitest';

import type { Database } from '@/db/client';
import type { ClientToServerEvents, ServerToClientEvents } from '@/realtime/events';
import type { Auth } from '@/server/auth/auth';
import type { ReviewNews } from '@/server/contracts/news';

import { createTestApp, type TestUser } from '../helpers/api';
import { startTestServer } from '../helpers/test-server';
import { addCandidates, teamWithReview, type DiscussionTeam } from '../server/fixtures/discussion';

/** Shared by the live board's socket tests: a Team on a real server, clients, and waiting. */

export type Client = Socket<ServerToClientEvents, ClientToServerEvents>;
export type AckResult = { ok: true } | { error: { code: string; message: string; field?: string } };

/** A socket.io client of `baseURL` with `cookie`, sending the app's Origin; resolves when connected. */
export function openClient(baseURL: string, cookie: string | undefined, opened: Client[]): Promise<Client> {
  const socket: Client = connect(baseURL, {
    transports: ['websocket'],
    extraHeaders: cookie ? { cookie, origin: baseURL } : { origin: baseURL },
    reconnection: false,
    forceNew: true,
  });
  opened.push(socket);
  return new Promise((resolve, reject) => {
    socket.once('connect', () => resolve(socket));
    socket.once('connect_error', reject);
  });
}

/** A socket of `cookie` on `baseURL` that has joined `reviewId`; resolves after the ack. */
export async function joinBoard(baseURL: string, cookie: string, reviewId: string, opened: Client[]): Promise<Client> {
  const socket = await openClient(baseURL, cookie, opened);
  expect(await socket.emitWithAck('review:join', { reviewId })).toEqual({ ok: true });
  return socket;
}

/** Resolves once `done()` holds; the test's own timeout bounds the wait. */
export async function until(done: () => boolean): Promise<void> {
  while (!done()) await new Promise((r) => setTimeout(r, 5));
}

/** Everything `socket` hears of `event`, in order. */
export function heard<E extends keyof ReviewNews>(socket: Client, event: E): Array<ReviewNews[E]> {
  const got: Array<ReviewNews[E]> = [];
  (socket.on as (event: string, listener: (payload: ReviewNews[E]) => void) => void)(event, (payload) =>
    got.push(payload),
  );
  return got;
}

/** The next `event` on `socket` that `match` accepts. */
export function next<E extends keyof ReviewNews>(
  socket: Client,
  event: E,
  match: (payload: ReviewNews[E]) => boolean = () => true,
): Promise<ReviewNews[E]> {
  return new Promise((resolve) => {
    const on = socket.on as (event: string, listener: (payload: ReviewNews[E]) => void) => void;
    const off = socket.off as (event: string, listener: (payload: ReviewNews[E]) => void) => void;
    const listener = (payload: ReviewNews[E]) => {
      if (!match(payload)) return;
      off.call(socket, event, listener);
      resolve(payload);
    };
    on.call(socket, event, listener);
  });
}

/** Names of the people in a presence payload, with what each looks at. */
export const seen = (payload: ReviewNews['presence:changed']) =>
  payload.people.map((p) => `${p.name}:${p.candidateId ?? 'board'}`);

export type BoardTeam = DiscussionTeam;

/**
 * A Team with one person in each role (signed up on the real server at `baseURL`), a Review
 * its Lead made there, and `candidateCount` candidates. Candidates are written straight to
 * their table: the room only needs them to exist, not to be computed.
 */
export const boardTeam = (ctx: { db: Database; auth: Auth }, baseURL: string, label: string, candidateCount = 3) =>
  teamWithReview(baseURL, ctx, label, candidateCount);

export async function addReview(by: TestUser, teamId: string, name: string): Promise<string> {
  const created = await by.agent.post(`/api/teams/${teamId}/reviews`).send({ name });
  if (created.status !== 201)
    throw new Error(`review create failed: ${created.status} ${JSON.stringify(created.body)}`);
  return created.body.id as string;
}

export { addCandidates };

export type LiveBoards = {
  server: Awaited<ReturnType<typeof startTestServer>>;
  ctx: ReturnType<typeof createTestApp>;
  /** The Team under test, with `candidates` candidates. */
  t: BoardTeam;
  /** Another Team with one candidate, whose board must hear nothing of t's. */
  them: BoardTeam;
  /** A socket of `cookie` that has joined `reviewId`. */
  onBoard(cookie: string, reviewId: string): Promise<Client>;
  /** A socket of `cookie` that has joined nothing. */
  open(cookie?: string): Promise<Client>;
};

/**
 * For one test file: a real server and the test app, started before its tests and stopped
 * (with every socket opened through it) after; a Team `ours` and an outsider Team `theirs`.
 * The fields are filled once the file's beforeAll has run.
 */
export function liveBoards(ours: { label: string; candidates: number }, theirs: string): LiveBoards {
  const sockets: Client[] = [];
  const live = {
    onBoard: (cookie: string, reviewId: string) => joinBoard(live.server.baseURL, cookie, reviewId, sockets),
    open: (cookie?: string) => openClient(live.server.baseURL, cookie, sockets),
  } as LiveBoards;
  beforeAll(async () => {
    live.server = await startTestServer();
    live.ctx = createTestApp();
    live.t = await boardTeam(live.ctx, live.server.baseURL, ours.label, ours.candidates);
    live.them = await boardTeam(live.ctx, live.server.baseURL, theirs, 1);
  });
  afterAll(async () => {
    for (const s of sockets) s.disconnect();
    await live.server.stop();
    await live.ctx.close();
  });
  return live;
}
