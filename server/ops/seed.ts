import { and, asc, count, eq, inArray } from 'drizzle-orm';

import type { Database } from '@/db/client';
import { candidate, review, user } from '@/db/schema';
import { createAuth } from '@/server/auth/auth';
import type { TeamRole } from '@/server/contracts/roles';
import { updateDesignBasis } from '@/server/services/board';
import { noBroadcast } from '@/server/services/broadcast';
import { createCandidate, updateCandidate } from '@/server/services/candidates';
import { postComment } from '@/server/services/comments';
import { createReview } from '@/server/services/reviews';
import { castBallot, closeRound, openRound } from '@/server/services/rounds';
import { putScores } from '@/server/services/scores';

import { seedDemoSiteYear } from './demo-site-year';

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
  // The first review opens onto a working board: its basis and candidates, then a closed round and comments.
  const board = await seedDemoBoard(db, teamId, ids);
  // Its invented hourly year, for the candidates' rating curves and years.
  await seedDemoSiteYear(db, board.reviewId, ids.lead);
  await seedDemoDiscussion(db, teamId, ids);
  await seedDemoScores(db, board.reviewId, ids);
  return { teamId };
}

/**
 * The first demo review's board: the Kestrel Fell design basis and five candidates, one per
 * preset, each tuned a little by the Engineer, through the services (so every number comes
 * from the engine and Activity is written as for anyone). Site, fuel and tuning are invented
 * but plausible for a cold-climate peaking unit. Returns the candidates' ids by preset.
 */
export async function seedDemoBoard(db: Database, teamId: string, ids: Record<TeamRole, string>) {
  const [first] = await db
    .select({ id: review.id })
    .from(review)
    .where(and(eq(review.teamId, teamId), eq(review.name, demoReviews[0].name)))
    .limit(1);
  if (!first) throw new Error('The first demo review is missing; seed the reviews first.');
  const as = (role: TeamRole) => ({ db, broadcast: noBroadcast, actorId: ids[role] });

  // A peaking unit runs few hours: first cost and simplicity weigh more than efficiency.
  await updateDesignBasis(as('lead'), first.id, {
    ambient: { temperatureK: 258.15, elevationM: 310, relativeHumidity: 0.8 },
    fuel: { hydrogenVolumeFraction: 0.2, temperatureK: 278.15 },
    fluid: 'combustion',
    netPowerKW: 40_000,
    generatorEfficiency: 0.984,
    limits: { maxTurbineInletTemperatureK: 1650, exhaustTemperatureMinK: 700, exhaustTemperatureMaxK: 900 },
    // A peaking unit: a few hundred fired hours a year (common practice).
    firedHoursPerYear: 600,
    criteria: [
      { id: 'efficiency', name: 'Efficiency', weight: 15, measure: 'thermalEfficiency' },
      { id: 'specific-work', name: 'Specific work', weight: 20, measure: 'netWorkKJPerKg' },
      { id: 'co2', name: 'CO2', weight: 15, measure: 'co2KgPerMWh' },
      { id: 'complexity', name: 'Complexity', weight: 20, measure: null },
      { id: 'maintainability', name: 'Maintainability', weight: 15, measure: null },
      { id: 'first-cost', name: 'First-cost class', weight: 15, measure: null },
    ],
  });

  const plan = [
    {
      name: 'Simple, 19:1',
      preset: 'simple',
      status: 'shortlisted',
      parameters: { compressor: { pressureRatio: 19 }, turbine: { inletTemperatureK: 1580 } },
    },
    {
      name: 'Recuperated, 7.5:1',
      preset: 'regenerative',
      status: 'shortlisted',
      parameters: { compressor: { pressureRatio: 7.5 }, regenerator: { effectiveness: 0.87 } },
    },
    {
      name: 'Intercooled, 28:1',
      preset: 'intercooled',
      status: 'proposed',
      parameters: { compressor: { pressureRatio: 28, intercoolerPressureLoss: 0.02 } },
    },
    {
      name: 'Sequential reheat, 32:1',
      preset: 'reheat',
      status: 'set-aside',
      parameters: { compressor: { pressureRatio: 32 }, turbine: { reheatTemperatureK: 1500 } },
    },
    {
      name: 'Intercooled, reheated, recuperated',
      preset: 'intercooled-reheat-regenerative',
      status: 'proposed',
      parameters: { compressor: { pressureRatio: 12 }, turbine: { inletTemperatureK: 1450 } },
    },
  ] as const;
  const made: Record<string, string> = {};
  for (const c of plan) {
    const created = await createCandidate(as('engineer'), first.id, { name: c.name, preset: c.preset });
    await updateCandidate(as('engineer'), first.id, created.id, { parameters: c.parameters, ifRevision: 1 });
    if (c.status !== 'proposed') await updateCandidate(as('lead'), first.id, created.id, { status: c.status });
    made[c.preset] = created.id;
  }
  return { reviewId: first.id, candidates: made };
}

/**
 * The first demo review's discussion: one closed preference round and a few comments, through
 * the services (so Activity is written as for anyone). Runs after the review has its
 * candidates; it finds them by the review and by preset.
 */
export async function seedDemoDiscussion(db: Database, teamId: string, ids: Record<TeamRole, string>) {
  const [first] = await db
    .select({ id: review.id })
    .from(review)
    .where(and(eq(review.teamId, teamId), eq(review.name, demoReviews[0].name)))
    .limit(1);
  if (!first) throw new Error('The first demo review is missing; seed the reviews first.');
  const found = await db
    .select({ id: candidate.id, preset: candidate.preset })
    .from(candidate)
    .where(eq(candidate.reviewId, first.id))
    .orderBy(asc(candidate.position));
  if (found.length < 3) throw new Error('The first demo review needs its candidates before its discussion.');
  // By preset where the candidates have one, else by their place on the board.
  const pick = (preset: string, place: number) => (found.find((c) => c.preset === preset) ?? found[place]).id;
  const simple = pick('simple', 0);
  const regenerative = pick('regenerative', 1);
  const intercooled = pick('intercooled', 2);

  const as = (role: TeamRole) => ({ db, broadcast: noBroadcast, actorId: ids[role] });
  const listener = (role: TeamRole) => ({ userId: ids[role], role });

  const opened = await openRound(as('lead'), first.id, { votesPerPerson: 3, blind: false }, listener('lead'));
  const ballots: Array<[TeamRole, Record<string, number>]> = [
    ['lead', { [simple]: 1, [regenerative]: 2 }],
    ['engineer', { [regenerative]: 2, [intercooled]: 1 }],
    ['reviewer', { [simple]: 2, [regenerative]: 1 }],
  ];
  for (const [role, votes] of ballots) await castBallot(as(role), first.id, opened.id, votes, listener(role));
  await closeRound(as('lead'), first.id, opened.id, listener('lead'));

  const post = (role: TeamRole, clientId: string, body: string, at: { candidateId?: string; parentId?: string }) =>
    postComment(as(role), first.id, { body, clientId, ...at }).then((p) => p.comment.id);
  const question = await post(
    'reviewer',
    'demo-comment-01',
    'With about 600 fired hours a year, does the fuel a recuperator saves ever pay for it? ' +
      '@Aiko Brennan, could you weigh it against the slower start?',
    {},
  );
  await post(
    'engineer',
    'demo-comment-02',
    'I will run the pressure-ratio sweep on the regenerative candidate before the next round and bring ' +
      'the fuel use per start alongside the start time.',
    { parentId: question },
  );
  await post(
    'lead',
    'demo-comment-03',
    'The simple cycle stays our reference: the fastest start and the fewest parts to keep up at a site this cold.',
    { candidateId: simple },
  );
  const intercooling = await post(
    'engineer',
    'demo-comment-04',
    'Intercooling needs a cooler loop of its own, and at a −15 °C design ambient it gains little. ' +
      '@Tomas Varga, shall we set it aside?',
    { candidateId: intercooled },
  );
  await post('lead', 'demo-comment-05', 'Keep it proposed until the second round; Rafael wants to see the sweep.', {
    parentId: intercooling,
  });
}

/**
 * The first demo review's Scores, so the comparison matrix opens populated: the Lead, the
 * Engineer and the Reviewer mark the judged criteria (1–5) through the service; the Reviewer
 * overrides one pre-score with a reason. Nobody has judged the first cost of the combined
 * cycle yet, so the matrix shows that candidate as incomplete.
 */
export async function seedDemoScores(db: Database, reviewId: string, ids: Record<TeamRole, string>) {
  const found = await db
    .select({ id: candidate.id, preset: candidate.preset })
    .from(candidate)
    .where(eq(candidate.reviewId, reviewId))
    .orderBy(asc(candidate.position));
  const id = (preset: string) => found.find((c) => c.preset === preset)?.id;
  // complexity, maintainability, first-cost per preset, per person (5 = best: simplest, cheapest).
  const marks: Record<'lead' | 'engineer' | 'reviewer', Record<string, [number, number, number | null]>> = {
    lead: {
      simple: [5, 5, 5],
      regenerative: [3, 3, 3],
      intercooled: [3, 3, 3],
      reheat: [3, 3, 3],
      'intercooled-reheat-regenerative': [1, 2, null],
    },
    engineer: {
      simple: [5, 4, 5],
      regenerative: [4, 3, 3],
      intercooled: [2, 3, 4],
      reheat: [3, 2, 3],
      'intercooled-reheat-regenerative': [1, 1, null],
    },
    reviewer: {
      simple: [4, 5, 4],
      regenerative: [3, 4, 2],
      intercooled: [3, 2, 3],
      reheat: [2, 3, 3],
      'intercooled-reheat-regenerative': [2, 1, null],
    },
  };
  const judged = ['complexity', 'maintainability', 'first-cost'] as const;
  for (const [role, byPreset] of Object.entries(marks) as Array<[keyof typeof marks, (typeof marks)['lead']]>) {
    const scores: Array<{ candidateId: string; criterionId: string; score: number; reason: string }> = Object.entries(
      byPreset,
    ).flatMap(([preset, values]) => {
      const candidateId = id(preset);
      if (!candidateId) return [];
      return judged.flatMap((criterionId, i) =>
        values[i] === null ? [] : [{ candidateId, criterionId, score: values[i], reason: '' }],
      );
    });
    if (role === 'reviewer' && id('regenerative')) {
      scores.push({
        candidateId: id('regenerative')!,
        criterionId: 'efficiency',
        score: 3,
        reason: 'At 600 fired hours a year its efficiency gain weighs less than the longer start.',
      });
    }
    await putScores({ db, broadcast: noBroadcast, actorId: ids[role] }, reviewId, scores);
  }
}
