/**
 * Engine benchmark: median microseconds per evaluation for each case, after warming all
 * cases together in one process (a case warmed alone can hide deoptimisation that mixed
 * work triggers). Run with `npm run bench`.
 */
import { evaluateCycle, sweepCycle } from '@/server/engine';
import { irrAir, irrCombustion, simpleAir, simpleCombustion } from '@/tests/engine/cases';

interface Case {
  readonly name: string;
  readonly targetMicroseconds: number | null;
  readonly run: () => unknown;
}

const cases: Case[] = [
  { name: 'simple, variable-cp air', targetMicroseconds: null, run: () => evaluateCycle(simpleAir, { paths: false }) },
  {
    name: '2+2 intercooled-reheat-regenerative, air',
    targetMicroseconds: null,
    run: () => evaluateCycle(irrAir, { paths: false }),
  },
  {
    name: '2+2 intercooled-reheat-regenerative, combustion',
    targetMicroseconds: 5,
    run: () => evaluateCycle(irrCombustion, { paths: false }),
  },
  {
    name: '2+2 combustion with T-s paths',
    targetMicroseconds: 10,
    run: () => evaluateCycle(irrCombustion),
  },
  {
    name: '200-point pressure-ratio sweep, simple combustion',
    targetMicroseconds: 1500,
    run: () =>
      sweepCycle({ base: simpleCombustion, parameter: 'compressor.pressureRatio', from: 2, to: 60, points: 200 }),
  },
];

let sink = 0;
function timeBatch(run: () => unknown, iterations: number): number {
  const start = performance.now();
  for (let i = 0; i < iterations; i++) {
    const result = run() as { netWorkKJPerKg?: number } | null;
    if (result && typeof result.netWorkKJPerKg === 'number') sink += result.netWorkKJPerKg;
  }
  return ((performance.now() - start) * 1000) / iterations;
}

function median(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  const mid = sorted.length >> 1;
  return sorted.length % 2 ? sorted[mid] : 0.5 * (sorted[mid - 1] + sorted[mid]);
}

// Warm every case together, interleaved, so the optimiser sees the mixed workload.
for (let round = 0; round < 40; round++) {
  for (const c of cases) timeBatch(c.run, c.targetMicroseconds !== null && c.targetMicroseconds > 100 ? 2 : 200);
}

const rows: string[] = [];
for (const c of cases) {
  const slow = c.targetMicroseconds !== null && c.targetMicroseconds > 100;
  const samples: number[] = [];
  for (let s = 0; s < 31; s++) samples.push(timeBatch(c.run, slow ? 5 : 2000));
  const measured = median(samples);
  const target = c.targetMicroseconds;
  const verdict = target === null ? '' : measured <= target ? 'within target' : 'OVER TARGET';
  rows.push(
    `${c.name.padEnd(52)} ${measured.toFixed(2).padStart(10)} µs   ${target === null ? '—'.padStart(10) : ('≤ ' + target).padStart(10) + ' µs'}   ${verdict}`,
  );
}
console.log(`${'case'.padEnd(52)} ${'median'.padStart(10)}      ${'target'.padStart(10)}`);
for (const row of rows) console.log(row);
if (!Number.isFinite(sink)) console.log('(non-finite result seen)');
