import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { createTeam, createTestApp, signUp, type TestUser } from '@/tests/helpers/api';
import { byTestId, requireWebBundle, signedInPage, type Browser } from '@/tests/helpers/browser';
import { startTestServer } from '@/tests/helpers/test-server';

/**
 * Candidate detail and design basis in a real browser: the preview follows an unsaved
 * pressure ratio, Save keeps it across a reload, the engine's refusal shows at its field,
 * a Lead's basis change recomputes the candidate, and a Reviewer reads both forms only.
 */

type Server = Awaited<ReturnType<typeof startTestServer>>;
let server: Server;
let ctx: ReturnType<typeof createTestApp>;
let lead: TestUser;
let reviewer: TestUser;
let reviewId: string;
let candidateId: string;
let browser: Browser;

const opened: Browser[] = [];
const signInAs = async (user: TestUser, size = { width: 390, height: 844 }) =>
  (await signedInPage(server.baseURL, user.cookie, size, opened, 10_000)).context() as Browser;

beforeAll(async () => {
  requireWebBundle();
  server = await startTestServer();
  ctx = createTestApp();
  lead = await signUp(server.baseURL, 'Ingrid Lead');
  reviewer = await signUp(server.baseURL, 'Rolf Reviewer');
  const teamId = await createTeam(ctx, lead, [{ user: reviewer, role: 'reviewer' }]);
  const review = await lead.agent.post(`/api/teams/${teamId}/reviews`).send({ name: 'Peaker cycle choice' });
  expect(review.status).toBe(201);
  reviewId = review.body.id;
  const basis = await lead.agent.put(`/api/reviews/${reviewId}/design-basis`).send({
    ambient: { temperatureK: 288.15, elevationM: 0, relativeHumidity: 0.6 },
    fuel: { hydrogenVolumeFraction: 0, temperatureK: 300 },
    fluid: 'combustion',
    netPowerKW: 50_000,
    generatorEfficiency: 0.985,
    limits: { maxTurbineInletTemperatureK: 1700 },
    criteria: [{ name: 'Efficiency', weight: 3, measure: 'thermalEfficiency' }],
  });
  expect(basis.status).toBe(200);
  const candidate = await lead.agent
    .post(`/api/reviews/${reviewId}/candidates`)
    .send({ name: 'Simple heavy-duty', preset: 'simple' });
  expect(candidate.status).toBe(201);
  candidateId = candidate.body.id;
  browser = await signInAs(lead);
});

afterAll(async () => {
  for (const b of opened) await b.dispose();
  await ctx?.close();
  await server?.stop();
});

describe('candidate detail', () => {
  it('previews an unsaved pressure ratio, saves it and keeps it after a reload', async () => {
    const page = browser.pages()[0] ?? (await browser.newPage());
    await page.goto(`${server.baseURL}/reviews/${reviewId}/candidates/${candidateId}`);
    await byTestId(page, 'parameter-form').waitFor();
    const saved = await byTestId(page, 'figure-thermalEfficiency-saved').textContent();
    expect(saved).toMatch(/%/);

    await byTestId(page, 'param-compressor-pressureRatio').fill('30');
    await byTestId(page, 'preview-badge').waitFor();
    await expect
      .poll(() => byTestId(page, 'figure-thermalEfficiency-preview').textContent(), { timeout: 10_000 })
      .toMatch(/%/);
    const preview = await byTestId(page, 'figure-thermalEfficiency-preview').textContent();
    expect(preview).not.toBe(saved);
    // Not saved yet: the stored candidate still has its old ratio.
    const before = await lead.agent.get(`/api/reviews/${reviewId}/board`);
    const stored = before.body.candidates.find((c: { id: string }) => c.id === candidateId);
    expect(stored.parameters.compressor.pressureRatio).not.toBe(30);

    await byTestId(page, 'parameters-save').click();
    await expect.poll(() => byTestId(page, 'parameters-unsaved').count()).toBe(0);
    await page.reload();
    await byTestId(page, 'parameter-form').waitFor();
    expect(await byTestId(page, 'param-compressor-pressureRatio').inputValue()).toBe('30');
    expect(await byTestId(page, 'figure-thermalEfficiency-saved').textContent()).toBe(preview);
  });

  it('shows the engine’s refusal at the field it names', async () => {
    const page = browser.pages()[0]!;
    // A turbine inlet below the compressor delivery temperature at a ratio of 30.
    await byTestId(page, 'param-turbine-inletTemperatureK').fill('600');
    await expect
      .poll(() => byTestId(page, 'param-turbine-inletTemperatureK-error').textContent(), { timeout: 10_000 })
      .toContain('compressor delivery temperature');
    await byTestId(page, 'parameters-discard').click();
  });
});

describe('design basis', () => {
  it('a Lead changes the ambient temperature and the candidate’s figures change', async () => {
    const page = browser.pages()[0]!;
    await page.goto(`${server.baseURL}/reviews/${reviewId}/candidates/${candidateId}`);
    const before = await byTestId(page, 'figure-thermalEfficiency-saved').textContent();
    await page.goto(`${server.baseURL}/reviews/${reviewId}/basis`);
    await byTestId(page, 'basis-ambient-temperatureK').fill('320');
    await byTestId(page, 'basis-save').click();
    await expect.poll(() => byTestId(page, 'basis-saved').textContent()).toContain('1 candidate recomputed');
    await page.goto(`${server.baseURL}/reviews/${reviewId}/candidates/${candidateId}`);
    await expect.poll(() => byTestId(page, 'figure-thermalEfficiency-saved').textContent()).not.toBe(before);
  });

  it('a Reviewer reads both forms only', async () => {
    const context = await signInAs(reviewer);
    try {
      const page = context.pages()[0] ?? (await context.newPage());
      await page.goto(`${server.baseURL}/reviews/${reviewId}/candidates/${candidateId}`);
      await byTestId(page, 'parameter-form').waitFor();
      expect(await byTestId(page, 'parameters-save').count()).toBe(0);
      expect(await byTestId(page, 'param-compressor-pressureRatio').getAttribute('readonly')).not.toBeNull();
      await page.goto(`${server.baseURL}/reviews/${reviewId}/basis`);
      await byTestId(page, 'basis-read-only').waitFor();
      expect(await byTestId(page, 'basis-save').count()).toBe(0);
      expect(await byTestId(page, 'basis-ambient-temperatureK').getAttribute('readonly')).not.toBeNull();
    } finally {
      await context.dispose();
    }
  });
});
