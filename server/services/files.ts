import { createHash, randomUUID } from 'node:crypto';
import type { Readable } from 'node:stream';

import { parse as parseCsv } from 'csv-parse/sync';
import { and, desc, eq } from 'drizzle-orm';

import type { Database } from '@/db/client';
import { candidate, review, storedFile, user } from '@/db/schema';
import {
  allowedFileTypes,
  maxFileBytes,
  maxFileNameLength,
  type AllowedFileType,
  type StoredFile,
  type UploadFileFields,
} from '@/server/contracts/files';
import { roleAllows } from '@/server/contracts/roles';
import { ApiError } from '@/server/http/errors';
import type { FileStorage } from '@/server/storage';

import { requireReview } from './access';
import { recordActivity } from './activity';
import type { Broadcast } from './broadcast';
import { reviewOf } from './reviews';

export type FilesContext = { db: Database; broadcast: Broadcast; storage: FileStorage; actorId: string };

const uuidPattern = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

const fileError = (message: string, code = 'invalid_file') => ApiError.invalidField('file', message, code);

const allowedList = 'PDF, PNG, JPEG, CSV or XLSX';

/**
 * The name as stored and offered on download: the last path part only, without control or
 * invisible formatting characters (bidi overrides among them), spaces collapsed, at most
 * 200 characters with the extension kept.
 */
export function sanitiseFileName(raw: string): string {
  const last = raw.split(/[/\\]/).pop() ?? '';
  let name = last
    .normalize('NFC')
    .replace(/[\p{Cc}\p{Cf}\p{Zl}\p{Zp}]/gu, '')
    .replace(/\s+/g, ' ')
    .trim()
    .replace(/^\.+/, '');
  if (name.length > maxFileNameLength) {
    const dot = name.lastIndexOf('.');
    const ext = dot > 0 && name.length - dot <= 6 ? name.slice(dot) : '';
    name = name.slice(0, maxFileNameLength - ext.length).trimEnd() + ext;
  }
  return name;
}

const extensionOf = (name: string) => {
  const dot = name.lastIndexOf('.');
  return dot > 0 ? name.slice(dot + 1).toLowerCase() : '';
};

/** CSV has no magic number: UTF-8 text without NUL bytes that csv-parse reads as rows. */
function looksLikeCsv(bytes: Buffer): boolean {
  if (bytes.includes(0)) return false;
  let text: string;
  try {
    text = new TextDecoder('utf-8', { fatal: true }).decode(bytes);
  } catch {
    return false;
  }
  try {
    const rows = parseCsv(text, { bom: true, relax_column_count: true, skip_empty_lines: true }) as unknown[];
    return rows.length > 0;
  } catch {
    return false;
  }
}

/**
 * The file's type taken from its bytes (file-type reads the signature; XLSX is a zip it
 * recognises as an OOXML spreadsheet), then held against the name's extension. Refusals
 * are 422s naming `file`.
 */
export async function detectFileType(bytes: Buffer, name: string): Promise<AllowedFileType> {
  const { fileTypeFromBuffer } = await import('file-type');
  const found = await fileTypeFromBuffer(bytes);
  let type: AllowedFileType | undefined;
  if (found) {
    if (!Object.hasOwn(allowedFileTypes, found.mime)) {
      throw fileError(
        `The content is of type ${found.ext.toUpperCase()} (${found.mime}); only ${allowedList} files can be attached.`,
        'file_type_not_allowed',
      );
    }
    type = found.mime as AllowedFileType;
  } else if (looksLikeCsv(bytes)) {
    type = 'text/csv';
  } else {
    throw fileError(`The content is not a file type that can be attached (${allowedList}).`, 'file_type_not_allowed');
  }
  const ext = extensionOf(name);
  const expected: readonly string[] = allowedFileTypes[type].extensions;
  if (!expected.includes(ext)) {
    throw fileError(
      `The content is a ${allowedFileTypes[type].label} but the name ends in ${ext ? `.${ext}` : 'no extension'}; ` +
        `name it .${expected[0]}.`,
      'file_name_mismatch',
    );
  }
  return type;
}

type Row = {
  id: string;
  reviewId: string;
  candidateId: string | null;
  name: string;
  contentType: string;
  sizeBytes: number;
  sha256: string;
  uploadedById: string | null;
  uploaderName: string | null;
  createdAt: Date;
};

const toFile = (r: Row): StoredFile => ({
  id: r.id,
  reviewId: r.reviewId,
  candidateId: r.candidateId,
  name: r.name,
  contentType: r.contentType,
  sizeBytes: r.sizeBytes,
  sha256: r.sha256,
  uploadedBy: r.uploadedById ? { id: r.uploadedById, name: r.uploaderName ?? '' } : null,
  createdAt: r.createdAt.toISOString(),
});

const selectFiles = (db: Database) =>
  db
    .select({
      id: storedFile.id,
      reviewId: storedFile.reviewId,
      candidateId: storedFile.candidateId,
      name: storedFile.name,
      contentType: storedFile.contentType,
      sizeBytes: storedFile.sizeBytes,
      sha256: storedFile.sha256,
      uploadedById: storedFile.uploadedById,
      uploaderName: user.name,
      createdAt: storedFile.createdAt,
      driver: storedFile.driver,
      storageKey: storedFile.storageKey,
    })
    .from(storedFile)
    .leftJoin(user, eq(user.id, storedFile.uploadedById));

/** A Review's files, newest first; only one candidate's with `candidateId`. */
export async function listFiles(db: Database, reviewId: string, candidateId?: string): Promise<StoredFile[]> {
  const where =
    candidateId === undefined
      ? eq(storedFile.reviewId, reviewId)
      : uuidPattern.test(candidateId)
        ? and(eq(storedFile.reviewId, reviewId), eq(storedFile.candidateId, candidateId))
        : undefined;
  if (!where) return [];
  const rows = await selectFiles(db).where(where).orderBy(desc(storedFile.createdAt), desc(storedFile.id));
  return rows.map(toFile);
}

async function candidateOfReview(db: Database, reviewId: string, candidateId: string) {
  if (!uuidPattern.test(candidateId)) return undefined;
  const [row] = await db
    .select({ id: candidate.id, name: candidate.name })
    .from(candidate)
    .where(and(eq(candidate.id, candidateId), eq(candidate.reviewId, reviewId)))
    .limit(1);
  return row;
}

/**
 * Stores an upload: type from the content, bytes to the driver, then the row and its
 * Activity line in one transaction; if that fails the bytes are deleted again, so a refusal
 * or a failure leaves nothing behind. `file:added` goes to the room after the commit.
 */
export async function uploadFile(
  { db, broadcast, storage, actorId }: FilesContext,
  reviewId: string,
  upload: { originalName: string; bytes: Buffer },
  fields: UploadFileFields,
): Promise<StoredFile> {
  const name = sanitiseFileName(upload.originalName);
  if (!name) throw fileError('The file needs a name.');
  if (upload.bytes.length === 0) throw fileError('The file is empty.');
  if (upload.bytes.length > maxFileBytes) {
    throw new ApiError(413, 'file_too_large', `file: a file may be at most 20 MB (${maxFileBytes} bytes).`, {
      field: 'file',
      fieldErrors: { file: ['A file may be at most 20 MB.'] },
    });
  }
  const target = fields.candidateId ? await candidateOfReview(db, reviewId, fields.candidateId) : undefined;
  if (fields.candidateId && !target) {
    throw ApiError.invalidField('candidateId', 'There is no such candidate in this Review.');
  }
  const contentType = await detectFileType(upload.bytes, name);
  const sha256 = createHash('sha256').update(upload.bytes).digest('hex');
  const storageKey = `${reviewId}/${randomUUID()}`;

  await storage.put(storageKey, upload.bytes, contentType);
  let id: string;
  try {
    id = await db.transaction(async (tx) => {
      const { teamId, name: reviewName } = await reviewOf(tx, reviewId);
      const [row] = await tx
        .insert(storedFile)
        .values({
          reviewId,
          candidateId: target?.id ?? null,
          name,
          contentType,
          sizeBytes: upload.bytes.length,
          sha256,
          driver: storage.driver,
          storageKey,
          uploadedById: actorId,
        })
        .returning({ id: storedFile.id });
      await recordActivity(tx, {
        teamId,
        reviewId,
        actorId,
        kind: 'file:added',
        detail: {
          fileId: row.id,
          name,
          reviewName,
          candidateName: target?.name ?? null,
          sizeBytes: upload.bytes.length,
        },
      });
      return row.id;
    });
  } catch (error) {
    await storage.delete(storageKey).catch((cleanup: unknown) => {
      console.error(`[files] could not remove the bytes of a refused upload (${storageKey}):`, cleanup);
    });
    throw error;
  }
  const [row] = await selectFiles(db).where(eq(storedFile.id, id));
  const file = toFile(row);
  broadcast.toReview(reviewId, 'file:added', { file });
  return file;
}

/** The file's row when `userId` is a member of its Review's Team (404 otherwise, as for a file that never was). */
async function accessibleFile(db: Database, userId: string, fileId: string) {
  if (!uuidPattern.test(fileId)) throw ApiError.notFound('The file');
  const [row] = await selectFiles(db).where(eq(storedFile.id, fileId)).limit(1);
  if (!row) throw ApiError.notFound('The file');
  try {
    const access = await requireReview(db, userId, row.reviewId);
    return { row, access };
  } catch (error) {
    if (error instanceof ApiError && error.status === 404) throw ApiError.notFound('The file');
    throw error;
  }
}

export type Download = { file: StoredFile; body: Buffer | Readable };

/** A file's bytes for a member of its Team. */
export async function downloadFile(db: Database, storage: FileStorage, userId: string, fileId: string) {
  const { row } = await accessibleFile(db, userId, fileId);
  if (row.driver !== storage.driver) {
    throw new ApiError(
      503,
      'storage_unavailable',
      `This file is kept by the ${row.driver} storage, which this server does not use (CYCLEMOOT_STORAGE).`,
    );
  }
  const body = await storage.get(row.storageKey);
  if (!body) throw ApiError.notFound('The file’s content');
  return { file: toFile(row), body } satisfies Download;
}

/**
 * Deletes a file: the Lead and the Owner any, whoever uploaded it their own (while their role
 * still lets them attach files). Row and Activity line in one transaction, then the bytes.
 */
export async function deleteFile({ db, broadcast, storage, actorId }: FilesContext, fileId: string): Promise<void> {
  const { row, access } = await accessibleFile(db, actorId, fileId);
  const mayDelete =
    roleAllows(access.role, { file: ['delete'] }) ||
    (row.uploadedById === actorId && roleAllows(access.role, { file: ['upload'] }));
  if (!mayDelete)
    throw ApiError.forbidden('Only the Lead, the Owner or the person who attached it may delete this file.');
  const deleted = await db.transaction(async (tx) => {
    const gone = await tx
      .delete(storedFile)
      .where(eq(storedFile.id, fileId))
      .returning({ id: storedFile.id, candidateId: storedFile.candidateId });
    if (gone.length === 0) return null;
    const [{ teamId, name: reviewName }] = await tx
      .select({ teamId: review.teamId, name: review.name })
      .from(review)
      .where(eq(review.id, row.reviewId));
    await recordActivity(tx, {
      teamId,
      reviewId: row.reviewId,
      actorId,
      kind: 'file:removed',
      detail: { fileId, name: row.name, reviewName },
    });
    return gone[0];
  });
  if (!deleted) throw ApiError.notFound('The file');
  if (row.driver === storage.driver) {
    await storage.delete(row.storageKey).catch((error: unknown) => {
      console.error(`[files] the bytes of deleted file ${fileId} stay in storage (${row.storageKey}):`, error);
    });
  }
  broadcast.toReview(row.reviewId, 'file:removed', {
    reviewId: row.reviewId,
    fileId,
    candidateId: deleted.candidateId,
  });
}
