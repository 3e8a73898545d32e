import { measuredBest } from '@/server/contracts/matrix';

import { runDraws, type DrawJob, type DrawPartial } from './draws';

/** A worker thread of the robustness pool (piscina): one chunk of draws per task. */
export default function runChunk(job: DrawJob): DrawPartial {
  return runDraws(job, measuredBest);
}
