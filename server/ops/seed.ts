import { count, inArray } from 'drizzle-orm';

import type { Database } from '@/db/client';
import { user } from '@/db/schema';
import { createAuth } from '@/server/auth/auth';
import type { TeamRole } from '@/server/contracts/roles';
import { noBroadcast } from '@/server/services/broadcast';
import { createReview } from '@/server/services/reviews';

/**
 * Demo data, a scenario of our own: Tindra Kraft, an invented northern utility, chooses
 * the cycle of a 40 MW peaking unit at its invented Kestrel Fell site (cold climate).
 * Every name, place and person here is made up.
 */
export const demoPassword = 'kestrel-fell-demo';

export const demoUsers: Array<{ name: string; email: string; role: TeamRole }> = [
  { name: 'Ingrid Solheim', email: 'owner@tindra.example', role: 'owner' },
  { name: 'Tomas Varga', email: 'lead@tindra.example', role: 'lead' },
  { name: 'Aiko Brennan', email: 'engineer@tindra.example', role: 'engineer' },
  { name: 'Rafael Okonjo', email: 'reviewer@tindra.example', role: 'reviewer' },
  { name: 'Mirela Dunn', email: 'observer@tindra.example', role: 'observer' },
];

export const demoTeam = { name: 'Tindra Kraft — Kestrel Fell', slug: 'tindra-kestrel-fell' };

export const demoReviews = [
  {
    name: 'Kestrel Fell 40 MW peaking unit',
    summary:
      'Cycle selection for a 40 MW net peaking unit at Kestrel Fell (design ambient −15 °C, 310 m elevation), ' +
      'natural gas with up to 20 % hydrogen blending. Fast starts, about 600 fired hours a year.',
  },
  {
    name: 'Kestrel Fell black-start set',
    summary:
      'A 4 MW black-start set for the same site: compare a small simple-cycle machine with a recuperated one ' +
      'for fuel use during long standby tests.',
  },
];

/** True when the database has no users yet. */
export async function isEmpty(db: Database): Promise<boolean> {
  const [{ n }] = await db.select({ n: count() }).from(user);
  return n === 0;
}

/** Writes the demo team, its five members (one per role) and two reviews. */
export async function seedDemo(db: Database) {
  // Sign-ups go through better-auth so the passwords are hashed exactly as at sign-up.
  const auth = createAuth({
    db,
    baseURL: 'http://127.0.0.1',
    secret: 'seed-only-secret-not-used-for-sessions',
    mailer: { async send() {} },
  });
  const ids: Record<TeamRole, string> = {} as Record<TeamRole, string>;
  for (const u of demoUsers) {
    const res = await auth.api.signUpEmail({ body: { name: u.name, email: u.email, password: demoPassword } });
    ids[u.role] = res.user.id;
  }
  // The demo people own their (invented) addresses: seeded as confirmed, so they sign in at once.
  await db
    .update(user)
    .set({ emailVerified: true })
    .where(inArray(user.id, Object.values(ids)));
  // The Team and its members through better-auth, as the app makes them; the Reviews through
  // the service, so their Activity lines are written by `recordActivity` as for anyone else.
  const created = await auth.api.createOrganization({
    body: { name: demoTeam.name, slug: demoTeam.slug, userId: ids.owner },
  });
  if (!created) throw new Error('The demo Team could not be created.');
  const teamId = created.id;
  for (const u of demoUsers) {
    if (u.role === 'owner') continue;
    await auth.api.addMember({ body: { userId: ids[u.role], role: u.role, organizationId: teamId } });
  }
  for (const r of demoReviews) {
    await createReview({ db, broadcast: noBroadcast, actorId: ids.lead }, teamId, r);
  }
  return { teamId };
}
