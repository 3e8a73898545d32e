import { io as connect, type Socket } from 'socket.io-client';
import supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import type { ClientToServerEvents, ServerToClientEvents } from '@/realtime/events';

import { startTestServer, uniqueEmail } from '../helpers/test-server';

type Client = Socket<ServerToClientEvents, ClientToServerEvents>;

let server: Awaited<ReturnType<typeof startTestServer>>;
const sockets: Client[] = [];

async function signUp(name: string) {
  const agent = supertest.agent(server.baseURL).set('Origin', server.baseURL);
  const res = await agent
    .post('/api/auth/sign-up/email')
    .send({ name, email: uniqueEmail(name), password: 'correct-horse-battery' });
  const cookie = (res.headers['set-cookie'] as unknown as string[]).map((c) => c.split(';')[0]).join('; ');
  return { agent, cookie, id: res.body.user.id as string };
}

function open(cookie?: string): Promise<Client> {
  const socket: Client = connect(server.baseURL, {
    transports: ['websocket'],
    extraHeaders: cookie ? { cookie } : {},
    reconnection: false,
  });
  sockets.push(socket);
  return new Promise((resolve, reject) => {
    socket.once('connect', () => resolve(socket));
    socket.once('connect_error', reject);
  });
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
    const team = await owner.agent
      .post('/api/auth/organization/create')
      .send({ name: 'Room team', slug: `room-${Date.now()}` });
    const teamId = team.body.id as string;

    const ownerSocket = await open(owner.cookie);
    const outsiderSocket = await open(outsider.cookie);
    expect(await ownerSocket.emitWithAck('team:join', { teamId })).toEqual({ ok: true });
    const refused = await outsiderSocket.emitWithAck('team:join', { teamId });
    expect(refused).toMatchObject({ error: { code: 'not_found' } });
    const invalid = await outsiderSocket.emitWithAck('team:join', { teamId: 42 } as never);
    expect(invalid).toMatchObject({ error: { code: 'invalid_input' } });

    let outsiderHeard = false;
    outsiderSocket.on('review:created', () => (outsiderHeard = true));
    const heard = new Promise<{ review: { name: string } }>((resolve) => ownerSocket.once('review:created', resolve));
    await owner.agent.post(`/api/teams/${teamId}/reviews`).send({ name: 'Announced review' }).expect(201);
    expect((await heard).review.name).toBe('Announced review');
    await new Promise((r) => setTimeout(r, 200));
    expect(outsiderHeard).toBe(false);
  });
});
