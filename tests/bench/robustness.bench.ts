/**
 * Robustness benchmark: 2000 draws × 5 candidates (the five presets at the default basis,
 * default uncertainty) on one thread, as one worker runs them. Target ≤ 150 ms. Median of 9
 * runs after 3 warm-up runs, and the first (cold) run. Run with `npm run bench`.
 */
import type { Criterion } from '@/server/contracts/board';
import type { CycleInput } from '@/server/engine';
import { defaultUncertainty, runDraws, summarise } from '@/server/robustness/draws';
import { engineInputOf, type BasisCore } from '@/server/services/design-basis';
import { defaultCriteria, defaultDesignBasis, presetParameters } from '@/server/services/presets';

const targetMs = 150;
const candidates = Object.entries(presetParameters).map(([id, p], i) => ({
  id,
  input: engineInputOf(defaultDesignBasis as BasisCore, p) as unknown as CycleInput,
  scores: { complexity: [1 + (i % 5), 5 - (i % 3)], maintainability: [3], 'first-cost': [2 + (i % 3)] },
}));
const task = {
  candidates,
  criteria: defaultCriteria as Criterion[],
  uncertainty: defaultUncertainty,
  seed: 1,
  from: 0,
  to: 2000,
};

let sink = 0;
function run(): number {
  const start = performance.now();
  const r = summarise(runDraws(task));
  sink += r.firstPlace.simple;
  return performance.now() - start;
}
const cold = run();
for (let i = 0; i < 3; i++) run();
const times = Array.from({ length: 9 }, run).sort((a, b) => a - b);
console.log(
  `robustness, 2000 draws × ${candidates.length} candidates: median ${times[4].toFixed(1)} ms (best ${times[0].toFixed(1)}, worst ${times[8].toFixed(1)}, first run ${cold.toFixed(1)}); target ≤ ${targetMs} ms ${times[4] <= targetMs ? 'met' : 'NOT met'}`,
);
if (!Number.isFinite(sink)) throw new Error('no result');
