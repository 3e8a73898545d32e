import type { DiagramCycle, DiagramSweep } from '@/components/diagrams';
import { evaluateCycle, sweepCycle } from '@/server/engine';
import { irrCombustion, simpleAir } from '@/tests/engine/cases';

/**
 * Real engine output for the diagram tests. The annotations are the point: a CycleResult
 * and a SweepResult must fit the diagrams' own structural types, or this file fails to compile.
 */
export const simpleCycle: DiagramCycle = evaluateCycle(simpleAir);

/** Intercooled + reheat + regenerative, burning a methane–hydrogen blend: 10 states. */
export const irrCycle: DiagramCycle = evaluateCycle(irrCombustion);

/** Pressure ratio 2–80 on the simple cycle: every sample feasible, both optima inside the range. */
export const pressureRatioSweep: DiagramSweep = sweepCycle({
  base: simpleAir,
  parameter: 'compressor.pressureRatio',
  from: 2,
  to: 80,
  points: 20,
});

/**
 * Turbine inlet temperature 400–1800 K on the simple cycle: below the compressor delivery
 * temperature (659.5 K) the engine refuses the value, so the first three samples have no figures.
 */
export const inletTemperatureSweep: DiagramSweep = sweepCycle({
  base: simpleAir,
  parameter: 'turbine.inletTemperatureK',
  from: 400,
  to: 1800,
  points: 15,
});

export const fixtures = [
  { name: 'simple', cycle: simpleCycle },
  { name: 'intercooled + reheat + regenerative', cycle: irrCycle },
] as const;
