import { existsSync, readFileSync } from 'node:fs';
import { request, type IncomingHttpHeaders } from 'node:http';
import path from 'node:path';
import { brotliDecompressSync, gunzipSync } from 'node:zlib';

import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { webDir } from '@/server/ops/web-build';
import { startTestServer } from '@/tests/helpers/test-server';

/**
 * The web bundle as a phone receives it from the real server: brotli or gzip written at
 * build time, the original's type, a year's cache for content-hashed files and none for
 * the page that names them.
 */

type Server = Awaited<ReturnType<typeof startTestServer>>;
type Reply = { status: number; headers: IncomingHttpHeaders; body: Buffer };

let server: Server;
/** The bundle index.html loads, e.g. `/_expo/static/js/web/entry-<hash>.js`. */
let entryPath: string;
let fontPath: string;

const immutable = 'public, max-age=31536000, immutable';
const chromiumEncodings = 'gzip, deflate, br, zstd';

/** node:http rather than fetch: fetch decompresses, and these tests need the bytes as sent. */
function get(urlPath: string, headers: Record<string, string> = {}): Promise<Reply> {
  return new Promise((resolve, reject) => {
    const req = request(`${server.baseURL}${urlPath}`, { headers }, (res) => {
      const chunks: Buffer[] = [];
      res.on('data', (chunk: Buffer) => chunks.push(chunk));
      res.on('end', () => resolve({ status: res.statusCode ?? 0, headers: res.headers, body: Buffer.concat(chunks) }));
      res.on('error', reject);
    });
    req.on('error', reject);
    req.end();
  });
}

/** Charset names are case-insensitive; the compressed and plain answers spell utf-8 differently. */
const contentType = (res: Reply) => res.headers['content-type']?.toLowerCase();

const original = (urlPath: string) => readFileSync(path.join(webDir, urlPath));

beforeAll(async () => {
  const index = path.join(webDir, 'index.html');
  if (!existsSync(index) || !existsSync(`${index}.br`)) {
    throw new Error('The compressed web bundle is missing: run `npm run web:build` (npm test builds it first).');
  }
  const script = readFileSync(index, 'utf8').match(/<script src="([^"]+\.js)"/)?.[1];
  if (!script) throw new Error('index.html names no script');
  entryPath = script;
  fontPath = readFileSync(path.join(webDir, entryPath), 'utf8').match(
    /\/assets\/node_modules\/@expo-google-fonts\/ibm-plex-sans\/400Regular\/[\w.]+\.ttf/,
  )![0];
  server = await startTestServer();
});

afterAll(async () => {
  await server?.stop();
});

describe('the bundle, compressed', () => {
  it('sends brotli to a browser that accepts it, even when it lists gzip first', async () => {
    const res = await get(entryPath, { 'accept-encoding': chromiumEncodings });
    expect(res.status).toBe(200);
    expect(res.headers['content-encoding']).toBe('br');
    expect(contentType(res)).toBe('text/javascript; charset=utf-8');
    expect(res.headers.vary).toMatch(/accept-encoding/i);
    expect(Number(res.headers['content-length'])).toBe(res.body.length);
    expect(res.body.length).toBeLessThan(original(entryPath).length / 3);
    expect(brotliDecompressSync(res.body).equals(original(entryPath))).toBe(true);
  });

  it('sends gzip to a client that accepts only gzip', async () => {
    const res = await get(entryPath, { 'accept-encoding': 'gzip' });
    expect(res.status).toBe(200);
    expect(res.headers['content-encoding']).toBe('gzip');
    expect(contentType(res)).toBe('text/javascript; charset=utf-8');
    expect(res.headers.vary).toMatch(/accept-encoding/i);
    expect(res.body.length).toBeLessThan(original(entryPath).length / 2);
    expect(gunzipSync(res.body).equals(original(entryPath))).toBe(true);
  });

  it('sends the plain file without Accept-Encoding, or when brotli and gzip are refused', async () => {
    const refusals: Record<string, string>[] = [
      {},
      { 'accept-encoding': 'identity' },
      { 'accept-encoding': 'br;q=0, gzip;q=0' },
    ];
    for (const headers of refusals) {
      const res = await get(entryPath, headers);
      expect(res.status).toBe(200);
      expect(res.headers['content-encoding']).toBeUndefined();
      expect(contentType(res)).toBe('text/javascript; charset=utf-8');
      expect(res.headers.vary).toMatch(/accept-encoding/i);
      expect(res.body.equals(original(entryPath))).toBe(true);
    }
  });

  it('sends the fonts compressed as font/ttf', async () => {
    const res = await get(fontPath, { 'accept-encoding': chromiumEncodings });
    expect(res.status).toBe(200);
    expect(res.headers['content-encoding']).toBe('br');
    expect(contentType(res)).toBe('font/ttf');
    expect(brotliDecompressSync(res.body).equals(original(fontPath))).toBe(true);
  });

  it('sends index.html compressed at / and at a deep link', async () => {
    for (const urlPath of ['/', '/index.html', '/reviews/4b1c1f6e-0000-4000-8000-000000000000/matrix']) {
      const res = await get(urlPath, { 'accept-encoding': chromiumEncodings });
      expect(res.status, urlPath).toBe(200);
      expect(res.headers['content-encoding'], urlPath).toBe('br');
      expect(contentType(res), urlPath).toBe('text/html; charset=utf-8');
      expect(brotliDecompressSync(res.body).equals(original('index.html')), urlPath).toBe(true);
    }
  });
});

describe('cache headers', () => {
  it('lets browsers keep content-hashed files for a year, in every encoding', async () => {
    for (const urlPath of [entryPath, fontPath]) {
      for (const encoding of ['br', 'gzip', 'identity']) {
        const res = await get(urlPath, { 'accept-encoding': encoding });
        expect(res.status).toBe(200);
        expect(res.headers['cache-control'], `${urlPath} ${encoding}`).toBe(immutable);
      }
    }
  });

  it('makes browsers revalidate index.html, at / and at deep links', async () => {
    for (const urlPath of ['/', '/index.html', '/reviews/some-review', '/team']) {
      for (const encoding of ['br', 'gzip', 'identity']) {
        const res = await get(urlPath, { 'accept-encoding': encoding });
        expect(res.status).toBe(200);
        expect(res.headers['cache-control'], `${urlPath} ${encoding}`).toBe('no-cache');
      }
    }
  });

  it('answers a revalidation of index.html with 304 while it is unchanged', async () => {
    const first = await get('/reviews/some-review', { 'accept-encoding': 'br' });
    const etag = first.headers.etag;
    expect(etag).toBeTruthy();
    const again = await get('/reviews/some-review', { 'accept-encoding': 'br', 'if-none-match': etag! });
    expect(again.status).toBe(304);
    expect(again.body.length).toBe(0);
  });

  it('keeps unhashed files for a short while only', async () => {
    const res = await get('/favicon.ico', { 'accept-encoding': 'br' });
    expect(res.status).toBe(200);
    expect(res.headers['cache-control']).toBe('public, max-age=3600');
  });
});

describe('what is not the bundle', () => {
  it('answers 404 for a hashed file that does not exist, not index.html', async () => {
    const missing = entryPath.replace(/[0-9a-f]{32}/, '0'.repeat(32));
    expect(missing).not.toBe(entryPath);
    for (const encoding of ['br', 'identity']) {
      const res = await get(missing, { 'accept-encoding': encoding });
      expect(res.status).toBe(404);
      expect(res.headers['content-encoding']).toBeUndefined();
      expect(res.headers['cache-control'] ?? '').not.toMatch(/immutable/);
      expect(res.body.toString()).not.toMatch(/<html/i);
    }
  });

  it('leaves the API to the API', async () => {
    const health = await get('/api/health', { 'accept-encoding': chromiumEncodings });
    expect(health.status).toBe(200);
    expect(health.headers['content-type']).toMatch(/^application\/json/);
    expect(health.headers['content-encoding']).toBeUndefined();
    expect(JSON.parse(health.body.toString())).toMatchObject({ status: 'ok' });

    const unknown = await get('/api/no-such-route', { 'accept-encoding': chromiumEncodings });
    expect(unknown.status).toBeGreaterThanOrEqual(400);
    expect(unknown.headers['content-type']).toMatch(/^application\/json/);
    expect(unknown.body.toString()).not.toMatch(/<html/i);
  });
});
