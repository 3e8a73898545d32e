import { io as connect, type Socket } from 'socket.io-client';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import type { ClientToServerEvents, ServerToClientEvents } from '@/realtime/events';

import { signUp as signUpAt, startTeam } from '../helpers/api';
import { startTestServer } from '../helpers/test-server';

type Client = Socket<ServerToClientEvents, ClientToServerEvents>;

let server: Awaited<ReturnType<typeof startTestServer>>;
const sockets: Client[] = [];

const signUp = (name: string) => signUpAt(server.baseURL, name);

function open(cookie?: string): Promise<Client> {
  const socket: Client = connect(server.baseURL, {
    transports: ['websocket'],
    extraHeaders: cookie ? { cookie, origin: server.baseURL } : { origin: server.baseURL },
    reconnection: false,
  });
  sockets.push(socket);
  return new Promise((resolve, reject) => {
    socket.once('connect', () => resolve(socket));
    socket.once('connect_error', reject);
  });
}

/** Resolves once `done()` holds; the test's own timeout bounds the wait. */
async function until(done: () => boolean): Promise<void> {
  while (!done()) await new Promise((r) => setTimeout(r, 5));
}

beforeAll(async () => {
  server = await startTestServer();
});
afterAll(async () => {
  for (const s of sockets) s.disconnect();
  await server.stop();
});

describe('team rooms', () => {
  it('refuses a connection without a session', async () => {
    await expect(open()).rejects.toThrow(/unauthorized/);
  });

  it('tells every member in the room about a new review, and no outsider', async () => {
    const owner = await signUp('Rita');
    const outsider = await signUp('Uwe');
    const teamId = await startTeam(owner, 'Room team');

    const ownerSocket = await open(owner.cookie);
    const outsiderSocket = await open(outsider.cookie);
    expect(await ownerSocket.emitWithAck('team:join', { teamId })).toEqual({ ok: true });
    const refused = await outsiderSocket.emitWithAck('team:join', { teamId });
    expect(refused).toMatchObject({ error: { code: 'not_found' } });
    const invalid = await outsiderSocket.emitWithAck('team:join', { teamId: 42 } as never);
    expect(invalid).toMatchObject({ error: { code: 'invalid_input' } });

    // The outsider is a member of a Team of its own, in whose room it hears its own news.
    const ownTeamId = await startTeam(outsider, 'Outsider team');
    expect(await outsiderSocket.emitWithAck('team:join', { teamId: ownTeamId })).toEqual({ ok: true });
    const outsiderHeard: string[] = [];
    outsiderSocket.on('review:created', ({ review }) => outsiderHeard.push(review.name));

    const heard = new Promise<{ review: { name: string } }>((resolve) => ownerSocket.once('review:created', resolve));
    await owner.agent.post(`/api/teams/${teamId}/reviews`).send({ name: 'Announced review' }).expect(201);
    expect((await heard).review.name).toBe('Announced review');
    // Then news the outsider is owed: one connection delivers in order, so once this has
    // arrived, anything the server had sent it about the other Team has arrived too.
    await outsider.agent.post(`/api/teams/${ownTeamId}/reviews`).send({ name: 'Own review' }).expect(201);
    await until(() => outsiderHeard.includes('Own review'));
    expect(outsiderHeard).toEqual(['Own review']);
  });

  it('stops telling a member who was removed from the Team', async () => {
    const owner = await signUp('Olav');
    const leaver = await signUp('Lea');
    const teamId = await startTeam(owner, 'Shrinking team');
    const invite = await owner.agent
      .post('/api/auth/organization/invite-member')
      .send({ email: leaver.email, role: 'reviewer', organizationId: teamId });
    await leaver.agent
      .post('/api/auth/organization/accept-invitation')
      .send({ invitationId: invite.body.id })
      .expect(200);

    const leaverSocket = await open(leaver.cookie);
    const ownerSocket = await open(owner.cookie);
    expect(await ownerSocket.emitWithAck('team:join', { teamId })).toEqual({ ok: true });
    expect(await leaverSocket.emitWithAck('team:join', { teamId })).toEqual({ ok: true });
    const first = new Promise((resolve) => leaverSocket.once('review:created', resolve));
    await owner.agent.post(`/api/teams/${teamId}/reviews`).send({ name: 'Heard by all' }).expect(201);
    await first;

    await owner.agent
      .post('/api/auth/organization/remove-member')
      .send({ memberIdOrEmail: leaver.email, organizationId: teamId })
      .expect(200);
    const ownTeamId = await startTeam(leaver, 'Leaver team');
    expect(await leaverSocket.emitWithAck('team:join', { teamId: ownTeamId })).toEqual({ ok: true });
    const heardAfter: string[] = [];
    leaverSocket.on('review:created', ({ review }) => heardAfter.push(review.name));
    const ownerHeard = new Promise((resolve) => ownerSocket.once('review:created', resolve));
    await owner.agent.post(`/api/teams/${teamId}/reviews`).send({ name: 'Not for leavers' }).expect(201);
    await ownerHeard;
    // As above: news for the leaver's own Team, sent later on the same connection, marks the point.
    await leaver.agent.post(`/api/teams/${ownTeamId}/reviews`).send({ name: 'Own review' }).expect(201);
    await until(() => heardAfter.includes('Own review'));
    expect(heardAfter).toEqual(['Own review']);
    // Rejoining is refused too.
    expect(await leaverSocket.emitWithAck('team:join', { teamId })).toMatchObject({ error: { code: 'not_found' } });
  });
});
