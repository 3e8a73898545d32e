import { useMemo, useState } from 'react';
import { StyleSheet, View } from 'react-native';
import Svg, { Circle, G, Line, Path, Rect } from 'react-native-svg';

import type { UnitSystem } from '@/components/ui/format';
import { useTheme } from '@/components/ui/theme';
import { fontFamily, space } from '@/components/ui/tokens';
import { useUnitSystem } from '@/components/ui/unit-system';

import { Axes, HaloText, HitLayer, KeyEntry, Readout, useMeasuredWidth } from './diagram-parts';
import { horizontalScale, plotArea, polylineD, tickCountFor, ticksOf, verticalScale, type Point } from './scales';
import {
  describeSweep,
  figureShown,
  nearestSample,
  optimumMark,
  parameterAxis,
  parameterDomain,
  parameterTitle,
  quantityDomain,
  quantityOf,
  quantityTitle,
  refusedBands,
  sampleTitle,
  seriesRuns,
  sweepFrames,
  type Quantity,
} from './sweep-geometry';
import type { DiagramSweep, SweepCurrent } from './types';

export type SweepChartProps = {
  /** The answer of POST /api/cycles/sweep; a `SweepResult` fits as it is. */
  sweep: DiagramSweep;
  /** The candidate's own value of the swept input, and its evaluated figures when known. */
  current?: SweepCurrent | null;
  /** Words for the current point's dashed line in the key under the chart. Default 'current'. */
  currentLabel?: string;
  /** Line colour: the candidate's colour. Default: the text colour. */
  colour?: string;
  /** Default: the signed-in user's choice (UnitSystemProvider), SI without one. */
  unitSystem?: UnitSystem;
  /** Width in px. Default: the width the container gives. */
  width?: number;
  /** Prefix of the test ids: `<id>`, `<id>-readout`, `<id>-hit`. Default 'sweep-chart'. */
  testID?: string;
};

const fontSize = 10;
const quantities: readonly Quantity[] = ['efficiency', 'netWork'];

/**
 * Thermal efficiency (upper panel) and net specific work (lower panel) against the swept
 * input, on one shared x axis. Each figure's highest value is ringed, the candidate's own
 * value is a dashed line, and values the engine refused are shaded bands where the line
 * breaks: a gap, never a zero. Tap or hover to read the nearest sample.
 */
export function SweepChart({
  sweep,
  current,
  currentLabel = 'current',
  colour,
  unitSystem,
  width,
  testID = 'sweep-chart',
}: SweepChartProps) {
  const theme = useTheme();
  const { system: userSystem } = useUnitSystem();
  const system = unitSystem ?? userSystem;
  const [measured, onLayout] = useMeasuredWidth(width);
  const [hovered, setHovered] = useState<number | null>(null);
  const line = colour ?? theme.text;
  const axis = useMemo(() => parameterAxis(sweep.parameter, system), [sweep.parameter, system]);
  const description = describeSweep(sweep, axis, system);

  const drawing = useMemo(() => {
    if (measured <= 0) return null;
    const frames = sweepFrames(measured);
    const x = horizontalScale(parameterDomain(sweep, axis, current), frames.efficiency);
    const area = plotArea(frames.efficiency);
    const xTicks = ticksOf(x, tickCountFor(area.right - area.left, 90, 2, 7));
    const bands = refusedBands(sweep.points, axis).map((b) => ({ ...b, left: x(b.from), right: x(b.to) }));
    const panels = quantities.map((quantity) => {
      const frame = quantity === 'efficiency' ? frames.efficiency : frames.netWork;
      const domain = quantityDomain(sweep, quantity, system, current);
      if (!domain) return { quantity, frame, y: null, yTicks: [], runs: [], optimum: null, currentAt: null };
      const y = verticalScale(domain, frame);
      const yArea = plotArea(frame);
      const runs = seriesRuns(sweep.points, quantity, axis, system).map((run) =>
        run.map((p) => ({ x: x(p.x), y: y(p.y), index: p.index })),
      );
      const mark = optimumMark(sweep, quantity, axis, system);
      const optimum = mark ? { ...mark, at: { x: x(mark.x), y: y(mark.y) } } : null;
      const currentAt: Point | null = current?.figures
        ? { x: x(axis.toShown(current.value)), y: y(quantityOf(quantity, current.figures, system)) }
        : null;
      return {
        quantity,
        frame,
        y,
        yTicks: ticksOf(y, tickCountFor(yArea.bottom - yArea.top, 40, 2, 4)),
        runs,
        optimum,
        currentAt,
      };
    });
    const currentX = current && Number.isFinite(current.value) ? x(axis.toShown(current.value)) : null;
    return { frames, x, xTicks, bands, panels, currentX };
  }, [sweep, axis, system, current, measured]);

  const height = sweepFrames(Math.max(measured, 1)).height;
  const hoveredPoint = hovered !== null ? sweep.points[hovered] : undefined;

  const onPoint = (at: Point) => {
    if (!drawing) return;
    const area = plotArea(drawing.frames.efficiency);
    if (at.x < area.left - 12 || at.x > area.right + 12) {
      setHovered(null);
      return;
    }
    setHovered(nearestSample(sweep.points, axis, drawing.x.invert(at.x)));
  };

  return (
    <View testID={testID} role="group" aria-label={description} onLayout={onLayout} style={styles.wrap}>
      <View style={{ height }}>
        {drawing ? (
          <>
            <Svg width={drawing.frames.efficiency.width} height={height} aria-hidden>
              {drawing.panels.map((panel) => {
                const area = plotArea(panel.frame);
                return (
                  <G key={panel.quantity}>
                    {drawing.bands.map((b) => (
                      <Rect
                        key={`${b.from}`}
                        x={b.left}
                        y={area.top}
                        width={Math.max(1, b.right - b.left)}
                        height={area.bottom - area.top}
                        fill={theme.danger}
                        opacity={0.1}
                      />
                    ))}
                    <Axes
                      frame={panel.frame}
                      theme={theme}
                      xTicks={drawing.xTicks}
                      yTicks={panel.yTicks}
                      xTitle={parameterTitle(axis)}
                      yTitle={quantityTitle(panel.quantity, system)}
                      fontSize={fontSize}
                      xLabels={panel.quantity === 'netWork'}
                    />
                    {panel.quantity === 'efficiency'
                      ? drawing.bands
                          .filter((b) => b.right - b.left >= 64)
                          .map((b) => (
                            <HaloText
                              halo={theme.surfaceRaised}
                              key={`label-${b.from}`}
                              x={(b.left + b.right) / 2}
                              y={area.top + fontSize + 4}
                              fontSize={fontSize}
                              fontFamily={fontFamily.sans}
                              fill={theme.danger}
                              textAnchor="middle"
                            >
                              not feasible
                            </HaloText>
                          ))
                      : null}
                    {panel.runs.map((run) =>
                      run.length > 1 ? (
                        <Path
                          key={run[0].index}
                          d={polylineD(run)}
                          stroke={line}
                          strokeWidth={2}
                          strokeLinejoin="round"
                          fill="none"
                        />
                      ) : null,
                    )}
                    {panel.runs.flat().map((p) => (
                      <Circle key={p.index} cx={p.x} cy={p.y} r={hovered === p.index ? 4 : 2} fill={line} />
                    ))}
                    {panel.optimum ? (
                      <G>
                        <Circle
                          cx={panel.optimum.at.x}
                          cy={panel.optimum.at.y}
                          r={6}
                          fill="none"
                          stroke={theme.good}
                          strokeWidth={2}
                        />
                        <HaloText
                          halo={theme.surfaceRaised}
                          x={panel.optimum.at.x + (labelLeft(panel.optimum.at.x, area) ? -10 : 10)}
                          y={Math.max(area.top + fontSize, panel.optimum.at.y - 8)}
                          fontSize={fontSize}
                          fontFamily={fontFamily.sansMedium}
                          fill={theme.good}
                          textAnchor={labelLeft(panel.optimum.at.x, area) ? 'end' : 'start'}
                        >
                          {panel.optimum.atRangeEnd ? 'max, range end' : 'max'}
                        </HaloText>
                      </G>
                    ) : null}
                    {drawing.currentX !== null ? (
                      <Line
                        x1={drawing.currentX}
                        x2={drawing.currentX}
                        y1={area.top}
                        y2={area.bottom}
                        stroke={line}
                        strokeWidth={1.25}
                        strokeDasharray="4 3"
                      />
                    ) : null}
                    {panel.currentAt ? (
                      <Circle
                        cx={panel.currentAt.x}
                        cy={panel.currentAt.y}
                        r={4.5}
                        fill={theme.surfaceRaised}
                        stroke={line}
                        strokeWidth={2}
                      />
                    ) : null}
                    {hoveredPoint ? (
                      <Line
                        x1={drawing.x(axis.toShown(hoveredPoint.value))}
                        x2={drawing.x(axis.toShown(hoveredPoint.value))}
                        y1={area.top}
                        y2={area.bottom}
                        stroke={theme.textMuted}
                        strokeWidth={1}
                      />
                    ) : null}
                  </G>
                );
              })}
            </Svg>
            <HitLayer
              width={drawing.frames.efficiency.width}
              height={height}
              testID={`${testID}-hit`}
              onPoint={onPoint}
              onLeave={() => setHovered(null)}
            />
          </>
        ) : null}
      </View>
      <Readout
        testID={`${testID}-readout`}
        title={hoveredPoint ? sampleTitle(hoveredPoint, axis) : null}
        note={hoveredPoint && !hoveredPoint.figures ? `Not feasible: ${hoveredPoint.error?.message ?? ''}` : null}
        items={
          hoveredPoint?.figures
            ? quantities.map((q) => ({
                symbol: q === 'efficiency' ? 'η' : 'w',
                ...figureShown(q, hoveredPoint.figures!, system),
              }))
            : []
        }
        hint="Tap or point along the chart to read a sample."
      />
      <View style={styles.key}>
        <KeyEntry label="highest value" colour={theme.good} />
        {current ? <KeyEntry label={currentLabel} colour={line} dashed /> : null}
        {drawing?.bands.length ? <KeyEntry label="not feasible (no line)" colour={theme.danger} /> : null}
      </View>
    </View>
  );
}

/** An optimum's words go left of its ring in the right half of the plot, right of it otherwise. */
function labelLeft(x: number, area: { left: number; right: number }): boolean {
  return x > (area.left + area.right) / 2;
}

const styles = StyleSheet.create({
  wrap: { width: '100%' },
  key: { flexDirection: 'row', flexWrap: 'wrap', columnGap: space[2], rowGap: space.half, paddingTop: space.half },
});
