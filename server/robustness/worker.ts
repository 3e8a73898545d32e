import { runDraws, type DrawChunk, type DrawTask } from './draws';

/** The pool's task: one chunk of draws, off the request thread. */
export default function run(task: DrawTask): DrawChunk {
  return runDraws(task);
}
