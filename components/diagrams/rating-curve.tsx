import { useMemo, useState } from 'react';
import { StyleSheet, View } from 'react-native';
import Svg, { Circle, G, Line, Path, Rect } from 'react-native-svg';

import { convert, formatNumber, type UnitSystem } from '@/components/ui/format';
import { useTheme } from '@/components/ui/theme';
import { fontFamily, space } from '@/components/ui/tokens';
import { useUnitSystem } from '@/components/ui/unit-system';
import type { RatingPoint } from '@/server/contracts/site-year';

import { Axes, HaloText, HitLayer, KeyEntry, Readout, useMeasuredWidth } from './diagram-parts';
import {
  horizontalScale,
  paddedExtent,
  plotArea,
  polylineD,
  tickCountFor,
  ticksOf,
  verticalScale,
  type Point,
} from './scales';
import type { Frame } from './types';

export type RatingCurveProps = {
  curve: readonly RatingPoint[];
  /** The required net power (a line on the power panel), kW. */
  requiredKW: number;
  /** The design basis ambient, K (a dashed line). */
  designK: number;
  /** The stored profile's temperature range, K (shaded), or null without one. */
  profileRange?: { minK: number; maxK: number } | null;
  colour?: string;
  unitSystem?: UnitSystem;
  width?: number;
  testID?: string;
};

type Panel = 'power' | 'heatRate' | 'exhaust';
const panels: readonly Panel[] = ['power', 'heatRate', 'exhaust'];
const fontSize = 10;

function valueOf(panel: Panel, p: RatingPoint, system: UnitSystem) {
  if (panel === 'power') return convert.power(p.netPowerKW, system);
  if (panel === 'heatRate') return convert.heatRate(p.heatRateKJPerKWh, system);
  return convert.temperature(p.exhaustTemperatureK, system);
}

const panelTitle: Record<Panel, string> = { power: 'Net power', heatRate: 'Heat rate', exhaust: 'Exhaust temperature' };

function frames(width: number): { height: number; frame: Record<Panel, Frame> } {
  const panel = Math.round(Math.max(100, Math.min(170, width * 0.3)));
  const side = { right: 16, left: 56 };
  const gap = 34;
  const height = 22 + 3 * panel + 2 * gap + 48;
  const top = (i: number) => 22 + i * (panel + gap);
  const frame = Object.fromEntries(
    panels.map((p, i) => [p, { width, height, margin: { ...side, top: top(i), bottom: height - top(i) - panel } }]),
  ) as Record<Panel, Frame>;
  return { height, frame };
}

/**
 * A fixed machine's rating curve: net power (with the required power), heat rate and exhaust
 * temperature against the ambient temperature, on one shared x axis. The design ambient is a
 * dashed line and the profile's range a shaded band. Tap or hover to read a point.
 */
export function RatingCurve({
  curve,
  requiredKW,
  designK,
  profileRange,
  colour,
  unitSystem,
  width,
  testID = 'rating-curve',
}: RatingCurveProps) {
  const theme = useTheme();
  const { system: userSystem } = useUnitSystem();
  const system = unitSystem ?? userSystem;
  const [measured, onLayout] = useMeasuredWidth(width);
  const [hovered, setHovered] = useState<number | null>(null);
  const line = colour ?? theme.text;
  const ambientUnit = convert.siteTemperature(288.15, system).unit;

  const drawing = useMemo(() => {
    if (measured <= 0 || curve.length < 2) return null;
    const { height, frame } = frames(measured);
    const xs = curve.map((p) => convert.siteTemperature(p.ambientK, system).amount);
    const x = horizontalScale([Math.min(...xs), Math.max(...xs)], frame.power);
    const area = plotArea(frame.power);
    const xTicks = ticksOf(x, tickCountFor(area.right - area.left, 70, 2, 9));
    const required = convert.power(requiredKW, system);
    const drawn = panels.map((panel) => {
      const values = curve.map((p) => valueOf(panel, p, system).amount);
      const extent = paddedExtent(panel === 'power' ? [...values, required.amount] : values, 0.08)!;
      const y = verticalScale(extent, frame[panel]);
      const yArea = plotArea(frame[panel]);
      const points: Point[] = curve.map((_, i) => ({ x: x(xs[i]), y: y(values[i]) }));
      return {
        panel,
        frame: frame[panel],
        y,
        points,
        unit: valueOf(panel, curve[0], system).unit,
        yTicks: ticksOf(y, tickCountFor(yArea.bottom - yArea.top, 36, 2, 4)),
      };
    });
    const band = profileRange
      ? {
          left: x(Math.max(xs[0], convert.siteTemperature(profileRange.minK, system).amount)),
          right: x(Math.min(xs[xs.length - 1], convert.siteTemperature(profileRange.maxK, system).amount)),
        }
      : null;
    return {
      height,
      frame,
      x,
      xTicks,
      drawn,
      band,
      designX: x(convert.siteTemperature(designK, system).amount),
      requiredY: drawn[0].y(required.amount),
    };
  }, [curve, measured, system, requiredKW, designK, profileRange]);

  const height = frames(Math.max(measured, 1)).height;
  const point = hovered !== null ? curve[hovered] : undefined;
  const description =
    `Rating curve: net power, heat rate and exhaust temperature from ${formatNumber(convert.siteTemperature(curve[0]?.ambientK ?? 0, system).amount, 3)} ` +
    `to ${formatNumber(convert.siteTemperature(curve[curve.length - 1]?.ambientK ?? 0, system).amount, 3)} ${ambientUnit} ambient.`;

  const onPoint = (at: Point) => {
    if (!drawing) return;
    let best: number | null = null;
    let distance = Infinity;
    drawing.drawn[0].points.forEach((p, i) => {
      const d = Math.abs(p.x - at.x);
      if (d < distance) {
        distance = d;
        best = i;
      }
    });
    setHovered(distance < 40 ? best : null);
  };

  return (
    <View testID={testID} role="group" aria-label={description} onLayout={onLayout} style={styles.wrap}>
      <View style={{ height }}>
        {drawing ? (
          <>
            <Svg width={measured} height={height} aria-hidden>
              {drawing.drawn.map((d, index) => {
                const area = plotArea(d.frame);
                return (
                  <G key={d.panel}>
                    {drawing.band ? (
                      <Rect
                        x={drawing.band.left}
                        y={area.top}
                        width={Math.max(1, drawing.band.right - drawing.band.left)}
                        height={area.bottom - area.top}
                        fill={theme.cold}
                        opacity={0.12}
                      />
                    ) : null}
                    <Axes
                      frame={d.frame}
                      theme={theme}
                      xTicks={drawing.xTicks}
                      yTicks={d.yTicks}
                      xTitle={`Ambient temperature (${ambientUnit})`}
                      yTitle={`${panelTitle[d.panel]} (${d.unit})`}
                      fontSize={fontSize}
                      xLabels={index === panels.length - 1}
                    />
                    {d.panel === 'power' ? (
                      <G>
                        <Line
                          x1={area.left}
                          x2={area.right}
                          y1={drawing.requiredY}
                          y2={drawing.requiredY}
                          stroke={theme.heat}
                          strokeWidth={1.25}
                        />
                        <HaloText
                          halo={theme.surfaceRaised}
                          x={area.right - 4}
                          y={drawing.requiredY - 5}
                          fontSize={fontSize}
                          fontFamily={fontFamily.sansMedium}
                          fill={theme.heat}
                          textAnchor="end"
                        >
                          required
                        </HaloText>
                      </G>
                    ) : null}
                    <Line
                      x1={drawing.designX}
                      x2={drawing.designX}
                      y1={area.top}
                      y2={area.bottom}
                      stroke={theme.textMuted}
                      strokeWidth={1}
                      strokeDasharray="4 3"
                    />
                    <Path d={polylineD(d.points)} stroke={line} strokeWidth={2} strokeLinejoin="round" fill="none" />
                    {d.points.map((p, i) => (
                      <Circle key={i} cx={p.x} cy={p.y} r={hovered === i ? 4 : 2} fill={line} />
                    ))}
                    {hovered !== null ? (
                      <Line
                        x1={d.points[hovered].x}
                        x2={d.points[hovered].x}
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
              width={measured}
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
        title={
          point
            ? `Ambient ${formatNumber(convert.siteTemperature(point.ambientK, system).amount, 3)} ${ambientUnit}${Math.abs(point.ambientK - designK) < 1e-6 ? ' · design basis' : ''}`
            : null
        }
        items={
          point
            ? [
                { symbol: 'P', ...shown(convert.power(point.netPowerKW, system)) },
                { symbol: 'HR', ...shown(convert.heatRate(point.heatRateKJPerKWh, system)) },
                { symbol: 'T exh', ...shown(convert.temperature(point.exhaustTemperatureK, system)) },
              ]
            : []
        }
        hint="Tap or point along the curve to read net power, heat rate and exhaust temperature."
      />
      <View style={styles.key}>
        <KeyEntry label="required net power" colour={theme.heat} />
        <KeyEntry label="design basis ambient" colour={theme.textMuted} dashed />
        {profileRange ? <KeyEntry label="site year's range" colour={theme.cold} /> : null}
      </View>
    </View>
  );
}

function shown(c: { amount: number; unit: string }) {
  return { value: formatNumber(c.amount, 4), unit: c.unit };
}

const styles = StyleSheet.create({
  wrap: { width: '100%', gap: space[1] },
  key: { flexDirection: 'row', flexWrap: 'wrap', gap: space[2] },
});
