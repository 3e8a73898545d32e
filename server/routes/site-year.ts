import { Router, type RequestHandler } from 'express';
import multer from 'multer';

import type { Database } from '@/db/client';
import { maxSiteYearBytes } from '@/server/contracts/site-year';
import { ApiError, parse } from '@/server/http/errors';
import { reviewParams } from '@/server/http/params';
import { uploadedFileName } from '@/server/http/upload-name';
import { requireReview } from '@/server/services/access';
import type { Broadcast } from '@/server/services/broadcast';
import { deleteSiteYear, getSiteYear, putSiteYear } from '@/server/services/site-year';
import { parseProfileCsv } from '@/server/services/site-year-csv';

/** One CSV in the field `file`, up to 10 MB, held in memory; no other parts. */
const receive = multer({
  storage: multer.memoryStorage(),
  limits: { fileSize: maxSiteYearBytes, files: 1, fields: 0, fieldNameSize: 100, parts: 2 },
}).single('file');

/** Multer's refusals in the product's envelope: 413 for a file over 10 MB, 422 naming the part otherwise. */
const receiveProfile: RequestHandler = (req, res, next) => {
  receive(req, res, (error: unknown) => {
    if (!error) return next();
    if (error instanceof multer.MulterError) {
      if (error.code === 'LIMIT_FILE_SIZE')
        return next(
          new ApiError(413, 'file_too_large', 'file: a site year file may be at most 10 MB (10485760 bytes).', {
            field: 'file',
            fieldErrors: { file: ['A site year file may be at most 10 MB.'] },
          }),
        );
      if (error.code === 'LIMIT_UNEXPECTED_FILE')
        return next(ApiError.invalidField(error.field || 'file', 'Send one CSV file, in the field "file".'));
      if (error.code === 'LIMIT_FIELD_COUNT' || error.code === 'LIMIT_PART_COUNT')
        return next(ApiError.invalidField(error.field || 'file', 'Send only the CSV file, in the field "file".'));
      return next(ApiError.invalidField(error.field || 'file', `The upload was refused: ${error.message}.`));
    }
    // A broken multipart body (busboy's own errors).
    next(new ApiError(400, 'malformed_upload', `The upload could not be read: ${(error as Error).message}`));
  });
};

/** The uploaded name read as UTF-8, without control characters; at most 200 characters. */
function uploadedName(raw: string): string {
  return (
    Array.from(uploadedFileName(raw), (ch) => (ch.charCodeAt(0) < 32 || ch.charCodeAt(0) === 127 ? '' : ch))
      .join('')
      .trim() || 'site-year.csv'
  ).slice(0, 200);
}

type Deps = { db: Database; broadcast: Broadcast };

/** A Review's site year: the hourly ambient profile (Lead, Owner) and each candidate's year over it. */
export function siteYearRouter({ db, broadcast }: Deps): Router {
  const router = Router();

  router.get('/reviews/:reviewId/site-year', async (req, res) => {
    const { reviewId } = parse(reviewParams, req.params);
    await requireReview(db, res.locals.user.id, reviewId);
    res.json(await getSiteYear(db, reviewId));
  });

  // Access is checked before the body is read: an outsider's 10 MB are never buffered.
  router.put(
    '/reviews/:reviewId/site-year',
    async (req, res, next) => {
      const { reviewId } = parse(reviewParams, req.params);
      await requireReview(db, res.locals.user.id, reviewId, { basis: ['update'] });
      if (!req.is('multipart/form-data'))
        throw ApiError.invalidField('file', 'Send the CSV as multipart/form-data in the field "file".');
      next();
    },
    receiveProfile,
    async (req, res) => {
      const { reviewId } = parse(reviewParams, req.params);
      if (!req.file) throw ApiError.invalidField('file', 'Attach the CSV in the field "file".');
      const parsed = parseProfileCsv(req.file.buffer);
      const summary = await putSiteYear(
        { db, broadcast, actorId: res.locals.user.id },
        reviewId,
        parsed,
        uploadedName(req.file.originalname),
      );
      res.json(summary);
    },
  );

  router.delete('/reviews/:reviewId/site-year', async (req, res) => {
    const { reviewId } = parse(reviewParams, req.params);
    await requireReview(db, res.locals.user.id, reviewId, { basis: ['update'] });
    await deleteSiteYear({ db, broadcast, actorId: res.locals.user.id }, reviewId);
    res.status(204).end();
  });

  return router;
}
