import { z } from 'zod';

/** Files attached to a Review or to one of its candidates: datasheets, site data, sketches. */

/** At most 20 MiB a file (the `stored_file` table checks the same). */
export const maxFileBytes = 20 * 1024 * 1024;

/** What may be attached, by the type read from the content, with the names' extensions for each. */
export const allowedFileTypes = {
  'application/pdf': { label: 'PDF', extensions: ['pdf'] },
  'image/png': { label: 'PNG image', extensions: ['png'] },
  'image/jpeg': { label: 'JPEG image', extensions: ['jpg', 'jpeg'] },
  'text/csv': { label: 'CSV table', extensions: ['csv'] },
  'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet': {
    label: 'Excel workbook (XLSX)',
    extensions: ['xlsx'],
  },
} as const;
export type AllowedFileType = keyof typeof allowedFileTypes;

export const allowedExtensions = Object.values(allowedFileTypes).flatMap((t) => t.extensions);

/** The longest stored name, in characters. */
export const maxFileNameLength = 200;

/** The multipart fields of POST /api/reviews/:reviewId/files besides `file`. */
export const uploadFileFields = z.strictObject({
  candidateId: z
    .string({ error: 'candidateId must be the id of a candidate of this Review.' })
    .min(1, 'candidateId must be the id of a candidate of this Review.')
    .max(100, 'candidateId must be the id of a candidate of this Review.')
    .optional(),
});
export type UploadFileFields = z.infer<typeof uploadFileFields>;

/** A stored file as the list, the upload's answer and the socket news carry it. */
export const storedFileSchema = z.object({
  id: z.string(),
  reviewId: z.string(),
  candidateId: z.string().nullable(),
  name: z.string(),
  contentType: z.string(),
  sizeBytes: z.number().int(),
  sha256: z.string(),
  uploadedBy: z.object({ id: z.string(), name: z.string() }).nullable(),
  createdAt: z.string(),
});
export type StoredFile = z.infer<typeof storedFileSchema>;

/** The label for a stored content type ("PDF", "PNG image", …). */
export function fileTypeLabel(contentType: string): string {
  return (allowedFileTypes as Record<string, { label: string }>)[contentType]?.label ?? contentType;
}
