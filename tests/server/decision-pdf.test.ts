import { mkdirSync, writeFileSync } from 'node:fs';
import path from 'node:path';

import { getDocument, OPS } from 'pdfjs-dist/legacy/build/pdf.mjs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import type { CandidateWire } from '@/server/contracts/board';
import { exportCaution } from '@/server/contracts/matrix';

import { createTestApp, type TestUser } from '../helpers/api';
import { completeDraft, computedCandidates } from './fixtures/decision';
import { discussionTeam, type DiscussionTeam } from './fixtures/discussion';

const ctx = createTestApp();
let t: DiscussionTeam;
let cands: CandidateWire[];

beforeAll(async () => {
  t = await discussionTeam(ctx, 'Oskar', 0);
  cands = await computedCandidates(t.lead, t.reviewId, ['Open cycle', 'Heat recovery', 'Two-spool cooled']);
});
afterAll(() => ctx.close());

type Pdf = {
  pages: number;
  text: string;
  bytes: Buffer;
  strokeColours: Set<string>;
  paths: number;
  ms: number;
  res: { headers: Record<string, string> };
};

/** Downloads the PDF as `who` and reads it back with pdf.js: page count and the text of every page. */
async function download(who: TestUser, query = ''): Promise<Pdf> {
  const started = performance.now();
  const res = await who.agent
    .get(`/api/reviews/${t.reviewId}/decision.pdf${query}`)
    .buffer(true)
    .parse((response, done) => {
      const chunks: Buffer[] = [];
      response.on('data', (c: Buffer) => chunks.push(c));
      response.on('end', () => done(null, Buffer.concat(chunks)));
    });
  expect(res.status, String(res.body)).toBe(200);
  const ms = Math.round(performance.now() - started);
  const bytes = res.body as Buffer;
  const doc = await getDocument({ data: new Uint8Array(bytes), useSystemFonts: false, isEvalSupported: false }).promise;
  let text = '';
  const strokeColours = new Set<string>();
  let paths = 0;
  for (let i = 1; i <= doc.numPages; i++) {
    const page = await doc.getPage(i);
    const content = await page.getTextContent();
    text += content.items.map((item) => ('str' in item ? item.str : '')).join(' ') + '\n';
    const ops = await page.getOperatorList();
    ops.fnArray.forEach((fn, k) => {
      if (fn === OPS.setStrokeRGBColor) strokeColours.add(String(ops.argsArray[k]).toLowerCase());
      if (fn === OPS.constructPath) paths++;
    });
  }
  const pages = doc.numPages;
  await doc.destroy();
  return { pages, text: text.replace(/\s+/g, ' '), bytes, strokeColours, paths, ms, res: res as unknown as Pdf['res'] };
}

/** '#E69F00' as pdf.js reports a stroke colour: '230,159,0'. */
const rgb = (hex: string) => [1, 3, 5].map((i) => parseInt(hex.slice(i, i + 2), 16)).join(',');

/** Text as pdf.js gives it back: words joined by single spaces. */
const flat = (s: string) => s.replace(/\s+/g, ' ').trim();

describe('the decision record as PDF', () => {
  it('a draft is marked as not signed, drawn from the live board, with the caution line on every page', async () => {
    await t.lead.agent.put(`/api/reviews/${t.reviewId}/decision`).send(completeDraft(cands[1]!, cands[0]!)).expect(200);
    const pdf = await download(t.observer);
    expect(pdf.res.headers['content-type']).toBe('application/pdf');
    expect(pdf.res.headers['content-disposition']).toMatch(/^attachment; filename="decision-record-.*-r1-draft\.pdf"$/);
    expect(pdf.bytes.subarray(0, 5).toString()).toBe('%PDF-');
    expect(pdf.pages).toBeGreaterThanOrEqual(2);
    expect(pdf.text).toContain('DRAFT — not signed');
    expect(pdf.text).toContain('Not signed. This draft is not a decision.');
    for (const c of cands) expect(pdf.text).toContain(c.name);
    // The caution line, once in the header and once in the footer of each page.
    const caution = pdf.text.split('Concept-stage estimates').length - 1;
    expect(caution).toBe(pdf.pages + 1);
  });

  it('signed: rationale, rejected with reasons, dissent, actions with owner and due date, signer, time, matrix', async () => {
    await t.lead.agent.post(`/api/reviews/${t.reviewId}/decision/sign`).send({}).expect(200);
    const decision = (await t.lead.agent.get(`/api/reviews/${t.reviewId}/decision`)).body;
    const signedAt = decision.current.signedAt as string;
    const draft = completeDraft(cands[1]!, cands[0]!);
    const pdf = await download(t.engineer);
    console.log(
      `[decision-pdf] signed record: ${pdf.pages} pages, ${pdf.bytes.length} bytes, answered in ${pdf.ms} ms`,
    );
    expect(pdf.res.headers['content-disposition']).toMatch(/-r1\.pdf"$/);
    // Kept for a person to look at (artifacts/ is not in git).
    mkdirSync(path.resolve('artifacts'), { recursive: true });
    writeFileSync(path.resolve('artifacts', 'decision-record-signed.pdf'), pdf.bytes);
    expect(pdf.text).not.toContain('DRAFT');
    for (const c of cands) expect(pdf.text).toContain(c.name);
    expect(pdf.text).toContain(flat(draft.rationale));
    expect(pdf.text).toContain(flat(draft.assumptions));
    expect(pdf.text).toContain(flat(draft.rejected[0]!.reason));
    expect(pdf.text).toContain(draft.dissent[0]!.name);
    expect(pdf.text).toContain(flat(draft.dissent[0]!.text));
    expect(pdf.text).toContain(draft.actions[0]!.text);
    expect(pdf.text).toContain(draft.actions[0]!.owner);
    expect(pdf.text).toContain('2027-01-15');
    expect(pdf.text).toContain(`Signed by ${t.lead.name}`);
    expect(pdf.text).toContain(`${signedAt.slice(0, 10)} ${signedAt.slice(11, 16)} UTC`);
    expect(pdf.text).toContain(flat(exportCaution).slice(0, 60));
    // Axes with units, and the matrix with figures in units.
    expect(pdf.text).toContain('Specific entropy s, kJ/(kg·K)');
    expect(pdf.text).toContain('Temperature T, K');
    expect(pdf.text).toContain('Thermal efficiency, %');
    // Each candidate's efficiency as the engine gave it, in per cent to 4 significant figures.
    for (const c of cands) {
      const percent = String(Number(((c.results!.thermalEfficiency as number) * 100).toPrecision(4)));
      expect(pdf.text).toContain(percent);
    }
    expect(pdf.text).toContain('Weighted total');
    // The T-s overlay is vector: each candidate's colour strokes paths in the content.
    for (const c of cands) expect(pdf.strokeColours).toContain(rgb(c.colour));
    expect(pdf.paths).toBeGreaterThan(cands.length * 4);
  });

  it('?revision=1 after reopening is the signed revision 1; the current one is the new draft', async () => {
    await t.lead.agent.post(`/api/reviews/${t.reviewId}/decision/reopen`).send({}).expect(201);
    await t.lead.agent
      .put(`/api/reviews/${t.reviewId}/decision`)
      .send({ rationale: 'Second look after the part-load data arrived.' })
      .expect(200);
    const current = await download(t.reviewer);
    expect(current.text).toContain('Revision 2 · Draft');
    expect(current.text).toContain('Second look after the part-load data arrived.');
    expect(current.text).toContain('DRAFT — not signed');
    const first = await download(t.reviewer, '?revision=1');
    expect(first.text).toContain('Revision 1 · Signed');
    expect(first.text).toContain(flat(completeDraft(cands[1]!, cands[0]!).rationale));
    expect(first.text).not.toContain('Second look');
    expect(first.text).toContain(`Signed by ${t.lead.name}`);

    const missing = await t.reviewer.agent.get(`/api/reviews/${t.reviewId}/decision.pdf?revision=9`);
    expect(missing.status).toBe(404);
    const bad = await t.reviewer.agent.get(`/api/reviews/${t.reviewId}/decision.pdf?revision=first`);
    expect(bad.status).toBe(422);
    expect(bad.body.error.field).toBe('revision');
  });
});
