export { TsDiagram, type TsDiagramProps } from './ts-diagram';
export { TsOverlay, type TsOverlayProps } from './ts-overlay';
export { SweepChart, type SweepChartProps } from './sweep-chart';
export type {
  DiagramCycle,
  DiagramPath,
  DiagramPathKind,
  DiagramSize,
  DiagramState,
  DiagramSweep,
  DiagramSweepFigures,
  DiagramSweepOptimum,
  DiagramSweepPoint,
  OverlayCandidate,
  SweepCurrent,
  SweepParameter,
} from './types';
