import path from 'node:path';

import { Piscina } from 'piscina';

import { mergeChunks, summarise, type DrawChunk, type DrawTask } from './draws';

/**
 * The worker pool of robustness runs (piscina). Draws are cut into chunks; each chunk is a
 * task on a worker thread, so the request thread stays free. Every draw has its own seeded
 * generator, so the result does not depend on the chunking or the number of threads.
 */

/** Draws per task: small enough for frequent progress and a quick cancel. */
export const chunkSize = 250;

export type RunOptions = {
  onProgress?: (done: number, total: number) => void;
  signal?: AbortSignal;
};

export function createRobustnessPool(maxThreads = 1) {
  const pool = new Piscina({
    filename: path.join(__dirname, 'worker.ts'),
    maxThreads,
    minThreads: 0,
    idleTimeout: 30_000,
    // The workers load TypeScript (and the @/ paths) through tsx, whatever started this process.
    execArgv: ['--import', 'tsx'],
  });

  async function run(task: Omit<DrawTask, 'from' | 'to'>, samples: number, options: RunOptions = {}) {
    const chunks: DrawChunk[] = new Array(Math.ceil(samples / chunkSize));
    let done = 0;
    await Promise.all(
      Array.from(chunks, async (_, k) => {
        const from = k * chunkSize;
        const to = Math.min(samples, from + chunkSize);
        chunks[k] = (await pool.run({ ...task, from, to }, { signal: options.signal })) as DrawChunk;
        done += to - from;
        options.onProgress?.(done, samples);
      }),
    );
    return summarise(mergeChunks(chunks));
  }

  return { run, close: () => pool.destroy() };
}
