import { eq } from 'drizzle-orm';
import supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { userSetting } from '@/db/schema';

import { createTestApp, signUp, testOrigin, type TestUser } from '../helpers/api';

const ctx = createTestApp();
let sana: TestUser;
let theo: TestUser;

beforeAll(async () => {
  sana = await signUp(ctx.app, 'Sana Settings');
  theo = await signUp(ctx.app, 'Theo Settings');
});
afterAll(() => ctx.close());

const stored = async (userId: string) =>
  (await ctx.db.select().from(userSetting).where(eq(userSetting.userId, userId)))[0]?.unitSystem;

describe('a person’s settings, kept with the account', () => {
  it('are SI until chosen otherwise, with nothing stored', async () => {
    const res = await sana.agent.get('/api/me/settings');
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ unitSystem: 'si', dailyDigest: false });
    expect(await stored(sana.id)).toBeUndefined();
  });

  it('keep US customary once chosen, on every device, for that person only', async () => {
    const put = await sana.agent.put('/api/me/settings').send({ unitSystem: 'us' });
    expect(put.status).toBe(200);
    expect(put.body).toEqual({ unitSystem: 'us', dailyDigest: false });
    // Another session (another device) of the same person reads the same.
    const elsewhere = await supertest(ctx.app).get('/api/me/settings').set('Cookie', sana.cookie);
    expect(elsewhere.body).toEqual({ unitSystem: 'us', dailyDigest: false });
    expect((await theo.agent.get('/api/me/settings')).body).toEqual({ unitSystem: 'si', dailyDigest: false });
    await sana.agent.put('/api/me/settings').send({ unitSystem: 'si' }).expect(200);
    expect(await stored(sana.id)).toBe('si');
    expect((await ctx.db.select().from(userSetting).where(eq(userSetting.userId, sana.id))).length).toBe(1);
  });

  it.each([
    [{ unitSystem: 'metric' }, 'unitSystem'],
    [{ unitSystem: 'US' }, 'unitSystem'],
    [{}, 'unitSystem'],
    [{ unitSystem: 'us', userId: 'someone-else' }, 'userId'],
    [[], '(body)'],
  ])('refuses %j with 422 naming %s, and changes nothing', async (body, field) => {
    await theo.agent.put('/api/me/settings').send({ unitSystem: 'us' }).expect(200);
    const res = await theo.agent.put('/api/me/settings').send(body);
    expect(res.status).toBe(422);
    expect(res.body.error.field).toBe(field);
    expect(await stored(theo.id)).toBe('us');
  });

  it('answers 401 without a session and 403 to a write from another site’s page', async () => {
    expect((await supertest(ctx.app).get('/api/me/settings')).status).toBe(401);
    const anonymous = await supertest(ctx.app)
      .put('/api/me/settings')
      .set('Origin', testOrigin)
      .send({ unitSystem: 'us' });
    expect(anonymous.status).toBe(401);
    const foreign = await supertest(ctx.app)
      .put('/api/me/settings')
      .set('Cookie', theo.cookie)
      .set('Origin', 'https://evil.example')
      .send({ unitSystem: 'si' });
    expect(foreign.status).toBe(403);
    expect(await stored(theo.id)).toBe('us');
  });
});

describe('the daily digest setting', () => {
  it('is off until chosen; choosing it keeps the unit system and starts the digest from now', async () => {
    const before = Date.now();
    const on = await theo.agent.put('/api/me/settings').send({ dailyDigest: true });
    expect(on.status).toBe(200);
    expect(on.body).toEqual({
      unitSystem: (await theo.agent.get('/api/me/settings')).body.unitSystem,
      dailyDigest: true,
    });
    const [row] = await ctx.db.select().from(userSetting).where(eq(userSetting.userId, theo.id));
    expect(row.dailyDigest).toBe(true);
    expect(row.digestSentAt!.getTime()).toBeGreaterThanOrEqual(before - 1_000);
    await theo.agent.put('/api/me/settings').send({ unitSystem: 'si' }).expect(200);
    expect((await theo.agent.get('/api/me/settings')).body).toEqual({ unitSystem: 'si', dailyDigest: true });
    const off = await theo.agent.put('/api/me/settings').send({ dailyDigest: false });
    expect(off.body).toEqual({ unitSystem: 'si', dailyDigest: false });
  });

  it.each([[{ dailyDigest: 'yes' }], [{ dailyDigest: 1 }], [{ dailyDigest: null }]])(
    'refuses %j with 422 naming dailyDigest',
    async (body) => {
      const res = await sana.agent.put('/api/me/settings').send(body);
      expect(res.status).toBe(422);
      expect(res.body.error.field).toBe('dailyDigest');
    },
  );
});
