import { mkdirSync, readFileSync } from 'node:fs';
import path from 'node:path';

import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { repoRoot } from '@/server/ops/paths';
import { signUp, startTeam, type TestUser } from '@/tests/helpers/api';
import { byTestId, requireWebBundle, signInThroughForm, type Browser } from '@/tests/helpers/browser';
import { startTestServer } from '@/tests/helpers/test-server';

import { pdfBytes, pngBytes } from '../server/fixtures/files';

/**
 * Files in Chromium at phone size (and a look at a wide screen): attach through the file
 * chooser, see it listed with size and type, download the same bytes, a lying name refused
 * with the server's words, a file attached elsewhere appearing live, delete.
 */

type Server = Awaited<ReturnType<typeof startTestServer>>;
let server: Server;
let owner: TestUser;
let reviewId: string;
const browsers: Browser[] = [];
const artifacts = path.join(repoRoot, 'artifacts');

beforeAll(async () => {
  requireWebBundle();
  mkdirSync(artifacts, { recursive: true });
  server = await startTestServer();
  owner = await signUp(server.baseURL, 'Petra Files');
  const teamId = await startTeam(owner, 'Files team');
  const created = await owner.agent.post(`/api/teams/${teamId}/reviews`).send({ name: 'Harbour site repowering' });
  expect(created.status).toBe(201);
  reviewId = created.body.id;
});

afterAll(async () => {
  for (const b of browsers) await b.dispose();
  await server?.stop();
});

async function signedIn(viewport: { width: number; height: number }) {
  const page = await signInThroughForm(server.baseURL, owner, viewport, browsers);
  await page.waitForURL((url) => !url.pathname.startsWith('/sign-in'));
  await page.goto(`${server.baseURL}/reviews/${reviewId}/files`);
  await byTestId(page, 'files-screen').waitFor();
  return page;
}

const listed = async () =>
  (await (
    await fetch(`${server.baseURL}/api/reviews/${reviewId}/files`, { headers: { cookie: owner.cookie } })
  ).json()) as Array<{
    id: string;
    name: string;
  }>;

describe('files in the browser', () => {
  it('attaches, lists, downloads, refuses a lying name, shows live news and deletes, on a phone', async () => {
    const page = await signedIn({ width: 390, height: 844 });
    await byTestId(page, 'files-empty').waitFor();

    // A 1.5 MB PNG through the file chooser.
    const png = Buffer.concat([pngBytes(16, 16), Buffer.alloc(1_500_000, 3)]);
    await byTestId(page, 'attach-file-input').setInputFiles({
      name: 'cooling-water-sketch.png',
      mimeType: 'image/png',
      buffer: png,
    });
    await expect.poll(async () => (await listed()).map((f) => f.name)).toEqual(['cooling-water-sketch.png']);
    const [stored] = await listed();
    const row = byTestId(page, `file-${stored.id}`);
    await row.waitFor();
    expect(await row.textContent()).toMatch(/cooling-water-sketch\.png.*1\.4 MB.*PNG image.*Petra Files/);
    await page.screenshot({ path: path.join(artifacts, 'files-phone.png'), fullPage: true });

    // Download: the same bytes, saved as the stored name.
    const [download] = await Promise.all([
      page.waitForEvent('download'),
      byTestId(page, `download-${stored.id}`).click(),
    ]);
    expect(download.suggestedFilename()).toBe('cooling-water-sketch.png');
    const saved = await download.path();
    expect(Buffer.compare(readFileSync(saved!), png)).toBe(0);

    // A PNG named .pdf: refused with the server's words, nothing listed.
    await byTestId(page, 'attach-file-input').setInputFiles({
      name: 'datasheet.pdf',
      mimeType: 'application/pdf',
      buffer: pngBytes(),
    });
    await byTestId(page, 'upload-error').waitFor();
    expect(await byTestId(page, 'upload-error').textContent()).toMatch(/PNG image.*\.pdf/);
    expect((await listed()).length).toBe(1);

    // Attached from another session: it shows without a reload.
    const other = await owner.agent
      .post(`/api/reviews/${reviewId}/files`)
      .attach('file', pdfBytes(), 'gas-turbine-datasheet.pdf');
    expect(other.status).toBe(201);
    await byTestId(page, `file-${other.body.id}`).waitFor({ timeout: 10_000 });
    expect(await byTestId(page, `file-${other.body.id}`).textContent()).toMatch(/gas-turbine-datasheet\.pdf.*B.*PDF/);

    // Deleted here: gone from the screen and from the server.
    await byTestId(page, `delete-${stored.id}`).click();
    await byTestId(page, `file-${stored.id}`).waitFor({ state: 'detached' });
    expect((await listed()).map((f) => f.id)).toEqual([other.body.id]);

    // Still there after a reload.
    await page.reload();
    await byTestId(page, `file-${other.body.id}`).waitFor();
  });

  it('reads as one list on a wide screen', async () => {
    const page = await signedIn({ width: 1440, height: 900 });
    await byTestId(page, 'files-list').waitFor();
    await page.screenshot({ path: path.join(artifacts, 'files-wide.png'), fullPage: true });
    const box = await byTestId(page, 'files-panel').boundingBox();
    expect(box!.width).toBeGreaterThan(600);
  });
});
