import { existsSync } from 'node:fs';
import type { ServerResponse } from 'node:http';
import path from 'node:path';

import type { Express } from 'express';
import expressStaticGzip from 'express-static-gzip';

/**
 * Expo names every bundle and asset after its content (`entry-<md5>.js`,
 * `close-icon.<md5>@2x.png`): such a file never changes under its name, so browsers may
 * keep it for a year without asking again.
 */
const contentHashedName = /[.-][0-9a-f]{20,}(@\d+(\.\d+)?x)?\.[a-z0-9]+$/i;

/** The variants the web build writes beside a file (see `server/ops/web-build.ts`). */
const compressedSuffix = /\.(br|gz)$/;

export const cacheControl = {
  contentHashed: 'public, max-age=31536000, immutable',
  /** index.html names the current bundle: always revalidated, so a new build is seen at once. */
  shell: 'no-cache',
  /** favicon, metadata.json: unhashed, so kept briefly. */
  other: 'public, max-age=3600',
} as const;

function setCacheControl(res: ServerResponse, servedPath: string) {
  const name = path.basename(servedPath.replace(compressedSuffix, ''));
  if (name === 'index.html') res.setHeader('Cache-Control', cacheControl.shell);
  else if (contentHashedName.test(name)) res.setHeader('Cache-Control', cacheControl.contentHashed);
  else res.setHeader('Cache-Control', cacheControl.other);
}

/**
 * Serves the exported web app from `webDir`: the brotli or gzip file the build wrote beside
 * each original when the browser accepts it (brotli first), with the original's
 * Content-Type and `Vary: Accept-Encoding`. Every other GET path without a file extension
 * answers index.html, so deep links (/reviews/<id>) load the app; a missing file with an
 * extension falls through to the 404. Mount after the API so /api is never reached here.
 * Does nothing when the bundle has not been built (the API alone is served).
 */
export function serveWebBundle(app: Express, webDir: string | undefined) {
  if (!webDir || !existsSync(path.join(webDir, 'index.html'))) return;
  // Scans webDir once for the compressed files, so the bundle must be built before the app is.
  const serve = expressStaticGzip(webDir, {
    enableBrotli: true,
    orderPreference: ['br'],
    index: false,
    serveStatic: { index: false, cacheControl: false, setHeaders: setCacheControl },
  });
  app.use(serve);
  app.get('/{*splat}', (req, res, next) => {
    if (path.extname(req.path)) return next();
    const url = req.url;
    req.url = '/index.html';
    serve(req, res, (err?: unknown) => {
      req.url = url;
      next(err);
    });
  });
}
