import { Router, type RequestHandler } from 'express';
import multer from 'multer';
import { z } from 'zod';

import type { Database } from '@/db/client';
import { maxFileBytes, uploadFileFields } from '@/server/contracts/files';
import { ApiError, parse } from '@/server/http/errors';
import { reviewParams } from '@/server/http/params';
import { uploadedFileName } from '@/server/http/upload-name';
import { requireReview } from '@/server/services/access';
import type { Broadcast } from '@/server/services/broadcast';
import { deleteFile, downloadFile, listFiles, uploadFile } from '@/server/services/files';
import type { FileStorage } from '@/server/storage';

const fileParams = z.object({ fileId: z.string().min(1).max(100) });
const listFilesQuery = z.strictObject({
  candidateId: z.string({ error: 'candidateId must be a candidate id.' }).min(1).max(100).optional(),
});

/** One file in the field `file`, up to 20 MiB, held in memory; at most a few small text fields. */
const receive = multer({
  storage: multer.memoryStorage(),
  limits: { fileSize: maxFileBytes, files: 1, fields: 4, fieldSize: 1024, fieldNameSize: 100, parts: 6 },
}).single('file');

/** Multer's refusals in the product's envelope: 413 for a file too large, 422 naming the part otherwise. */
const receiveUpload: RequestHandler = (req, res, next) => {
  receive(req, res, (error: unknown) => {
    if (!error) return next();
    if (error instanceof multer.MulterError) {
      if (error.code === 'LIMIT_FILE_SIZE') {
        return next(
          new ApiError(413, 'file_too_large', 'file: a file may be at most 20 MB (20971520 bytes).', {
            field: 'file',
            fieldErrors: { file: ['A file may be at most 20 MB.'] },
          }),
        );
      }
      if (error.code === 'LIMIT_UNEXPECTED_FILE') {
        const field = error.field || 'file';
        return next(ApiError.invalidField(field, 'Send one file, in the field "file".'));
      }
      if (error.code === 'LIMIT_FILE_COUNT') return next(ApiError.invalidField('file', 'Send one file at a time.'));
      return next(ApiError.invalidField(error.field || '(body)', `The upload was refused: ${error.message}.`));
    }
    // A broken multipart body (busboy's own errors).
    next(new ApiError(400, 'malformed_upload', `The upload could not be read: ${(error as Error).message}`));
  });
};

type Deps = { db: Database; broadcast: Broadcast; storage: FileStorage };

/** Files of a Review (datasheets, site data, sketches): upload, list, download, delete. */
export function filesRouter({ db, broadcast, storage }: Deps): Router {
  const router = Router();

  router.get('/reviews/:reviewId/files', async (req, res) => {
    const { reviewId } = parse(reviewParams, req.params);
    const { candidateId } = parse(listFilesQuery, req.query);
    await requireReview(db, res.locals.user.id, reviewId);
    res.json(await listFiles(db, reviewId, candidateId));
  });

  // Access is checked before the body is read: an outsider's 20 MB are never buffered.
  router.post(
    '/reviews/:reviewId/files',
    async (req, res, next) => {
      const { reviewId } = parse(reviewParams, req.params);
      if (!req.is('multipart/form-data')) {
        throw ApiError.invalidField('file', 'Send the file as multipart/form-data in the field "file".');
      }
      await requireReview(db, res.locals.user.id, reviewId, { file: ['upload'] });
      next();
    },
    receiveUpload,
    async (req, res) => {
      const { reviewId } = parse(reviewParams, req.params);
      const fields = parse(uploadFileFields, { ...(req.body ?? {}) });
      if (!req.file) throw ApiError.invalidField('file', 'Attach a file in the field "file".');
      const file = await uploadFile(
        { db, broadcast, storage, actorId: res.locals.user.id },
        reviewId,
        { originalName: uploadedFileName(req.file.originalname), bytes: req.file.buffer },
        fields,
      );
      res.status(201).json(file);
    },
  );

  router.get('/files/:fileId', async (req, res) => {
    const { fileId } = parse(fileParams, req.params);
    const { file, body } = await downloadFile(db, storage, res.locals.user.id, fileId);
    res.attachment(file.name);
    res.setHeader('Content-Type', file.contentType);
    res.setHeader('Content-Length', String(file.sizeBytes));
    res.setHeader('X-Content-Type-Options', 'nosniff');
    res.setHeader('Cache-Control', 'private, no-store');
    res.setHeader('Content-Security-Policy', "default-src 'none'; sandbox");
    if (Buffer.isBuffer(body)) {
      res.end(body);
      return;
    }
    await new Promise<void>((resolve, reject) => {
      body.once('error', reject);
      res.once('finish', resolve);
      res.once('close', resolve);
      body.pipe(res);
    });
  });

  router.delete('/files/:fileId', async (req, res) => {
    const { fileId } = parse(fileParams, req.params);
    // Access (membership, role or uploader) is decided inside, where the file's Review is known.
    await deleteFile({ db, broadcast, storage, actorId: res.locals.user.id }, fileId);
    res.status(204).end();
  });

  return router;
}
