import { describe, expect, it } from 'vitest';

import { reviewNews } from '@/realtime/events';

import { pdfBytes } from '../server/fixtures/files';
import { heard, liveBoards, next, until } from './live-fixture';

/** file:added and file:removed reach the Review's room on a real server, and no other Team's board. */

const live = liveBoards({ label: 'Filer', candidates: 1 }, 'Stranger');

describe('file news', () => {
  it('an Engineer’s upload and delete reach the Observer on the board, and nobody on another Team’s', async () => {
    const { t, them, onBoard, open } = live;
    const observer = await onBoard(t.observer.cookie, t.reviewId);
    const outsider = await onBoard(them.lead.cookie, them.reviewId);
    const outsiderAdded = heard(outsider, 'file:added');
    const outsiderRemoved = heard(outsider, 'file:removed');
    // Another Team's member cannot join this board to listen.
    expect(await (await open(them.lead.cookie)).emitWithAck('review:join', { reviewId: t.reviewId })).toMatchObject({
      error: { code: 'not_found' },
    });

    const added = next(observer, 'file:added');
    const up = await t.engineer.agent
      .post(`/api/reviews/${t.reviewId}/files`)
      .field('candidateId', t.candidates[0])
      .attach('file', pdfBytes(), 'compressor-map.pdf');
    expect(up.status).toBe(201);
    const got = await added;
    expect(reviewNews['file:added'].safeParse(got).success).toBe(true);
    expect(got.file).toEqual(up.body);

    const removed = next(observer, 'file:removed');
    expect((await t.engineer.agent.delete(`/api/files/${up.body.id}`)).status).toBe(204);
    expect(await removed).toEqual({ reviewId: t.reviewId, fileId: up.body.id, candidateId: t.candidates[0] });

    // The outsider's own board hears its own files, and only those.
    const theirs = next(outsider, 'file:added');
    await them.lead.agent
      .post(`/api/reviews/${them.reviewId}/files`)
      .attach('file', pdfBytes(), 'theirs.pdf')
      .expect(201);
    await theirs;
    await until(() => outsiderAdded.length >= 1);
    expect(outsiderAdded.map((p) => p.file.reviewId)).toEqual([them.reviewId]);
    expect(outsiderRemoved).toEqual([]);
  });
});
