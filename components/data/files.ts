import { useMutation, useQuery, useQueryClient, type QueryClient } from '@tanstack/react-query';
import { useEffect, useState } from 'react';

import { getRealtimeSocket } from '@/realtime/client';
import type { StoredFile } from '@/server/contracts/files';

import { api } from './api';
import { apiErrorFromBody, networkError } from './api-error';
import { onReviewNews } from './live';
import { apiOrigin } from './origin';
import { STALE } from './stale-times';

export const filesKeys = {
  all: ['files'] as const,
  review: (reviewId: string) => [...filesKeys.all, reviewId] as const,
};

/** GET /api/reviews/:reviewId/files — every file of the Review, newest first (filtered here per candidate). */
export function useFilesQuery(reviewId: string | undefined) {
  return useQuery({
    queryKey: filesKeys.review(reviewId ?? ''),
    queryFn: ({ signal }) => api.get<StoredFile[]>(`/api/reviews/${encodeURIComponent(reviewId!)}/files`, signal),
    // The room's file:added / file:removed keep the list current.
    staleTime: STALE.seconds.thirty,
    enabled: !!reviewId,
  });
}

/** The download address of a file (an attachment: the browser saves it). */
export const fileDownloadURL = (fileId: string) => `${apiOrigin()}/api/files/${encodeURIComponent(fileId)}`;

function addFile(qc: QueryClient, file: StoredFile) {
  qc.setQueryData<StoredFile[]>(filesKeys.review(file.reviewId), (list) =>
    list ? [file, ...list.filter((f) => f.id !== file.id)] : list,
  );
}

function removeFile(qc: QueryClient, reviewId: string, fileId: string) {
  qc.setQueryData<StoredFile[]>(filesKeys.review(reviewId), (list) => list?.filter((f) => f.id !== fileId));
}

/** A file picked on this device: a browser File (web) or anything Blob-like with a name. */
export type PickedFile = Blob & { name: string };

export type UploadProgress = { sentBytes: number; totalBytes: number };

/**
 * POST /api/reviews/:reviewId/files as multipart (field `file`, optional `candidateId`),
 * through XMLHttpRequest so the upload reports its progress. Same-origin cookies; the
 * server's error envelope becomes the app's ApiError.
 */
export function sendFile(
  reviewId: string,
  file: PickedFile,
  candidateId: string | undefined,
  onProgress: (p: UploadProgress) => void,
): Promise<StoredFile> {
  return new Promise((resolve, reject) => {
    const form = new FormData();
    if (candidateId) form.append('candidateId', candidateId);
    form.append('file', file, file.name);
    const xhr = new XMLHttpRequest();
    xhr.open('POST', `${apiOrigin()}/api/reviews/${encodeURIComponent(reviewId)}/files`);
    xhr.withCredentials = true;
    xhr.setRequestHeader('accept', 'application/json');
    xhr.upload.onprogress = (e) => {
      if (e.lengthComputable) onProgress({ sentBytes: e.loaded, totalBytes: e.total });
    };
    xhr.onerror = () => reject(networkError());
    xhr.onload = () => {
      let body: unknown;
      try {
        body = xhr.responseText ? JSON.parse(xhr.responseText) : null;
      } catch {
        body = null;
      }
      if (xhr.status >= 200 && xhr.status < 300) resolve(body as StoredFile);
      else reject(apiErrorFromBody(xhr.status, body));
    };
    xhr.send(form);
  });
}

/** Uploads a file with its progress; the list gets the stored file at once (the room hears file:added). */
export function useUploadFileMutation(reviewId: string, candidateId?: string) {
  const qc = useQueryClient();
  const [progress, setProgress] = useState<UploadProgress | null>(null);
  const mutation = useMutation({
    mutationFn: (file: PickedFile) => {
      setProgress({ sentBytes: 0, totalBytes: file.size });
      return sendFile(reviewId, file, candidateId, setProgress);
    },
    onSuccess: (file) => addFile(qc, file),
    onSettled: () => setProgress(null),
  });
  return { ...mutation, progress };
}

/** DELETE /api/files/:fileId; the file leaves the list once the server confirms. */
export function useDeleteFileMutation(reviewId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (fileId: string) => api.delete<void>(`/api/files/${encodeURIComponent(fileId)}`),
    onSuccess: (_none, fileId) => removeFile(qc, reviewId, fileId),
  });
}

/**
 * Patches the Review's file list from the room's `file:added` / `file:removed`. It only
 * listens: the board's `useReviewLiveUpdates(reviewId)` (or the files screen) joins the room.
 */
export function useFilesLiveUpdates(reviewId: string | undefined) {
  const qc = useQueryClient();
  useEffect(() => {
    if (!reviewId) return;
    const socket = getRealtimeSocket(apiOrigin());
    const offs = [
      onReviewNews(socket, 'file:added', ({ file }) => file.reviewId === reviewId && addFile(qc, file)),
      onReviewNews(
        socket,
        'file:removed',
        (news) => news.reviewId === reviewId && removeFile(qc, reviewId, news.fileId),
      ),
    ];
    const onReconnect = () => void qc.invalidateQueries({ queryKey: filesKeys.review(reviewId) });
    socket.on('connect', onReconnect);
    return () => {
      for (const off of offs) off();
      socket.off('connect', onReconnect);
    };
  }, [reviewId, qc]);
}
