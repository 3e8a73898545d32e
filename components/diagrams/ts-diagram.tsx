import { useMemo, useState } from 'react';
import { StyleSheet, View } from 'react-native';
import Svg, { Circle, G, Line, Path, Text as SvgText } from 'react-native-svg';

import type { UnitSystem } from '@/components/ui/format';
import { Text } from '@/components/ui/text';
import { useTheme } from '@/components/ui/theme';
import type { Theme } from '@/components/ui/themes';
import { fontFamily, space } from '@/components/ui/tokens';
import { useUnitSystem } from '@/components/ui/unit-system';

import { Axes, FocusTarget, HitLayer, Readout, Swatch, useMeasuredWidth } from './diagram-parts';
import { nearestPoint, plotArea, type Point } from './scales';
import {
  describeCycle,
  placeMarkers,
  projectCycle,
  stateQuantities,
  stateSentence,
  tsDomain,
  tsFrame,
  tsLook,
  tsScales,
  tsTicks,
  tsUnits,
  type PathRole,
} from './ts-geometry';
import type { DiagramCycle, DiagramSize } from './types';

export type TsDiagramProps = {
  /** The candidate's name, for the accessible description. */
  name: string;
  /** The evaluated cycle; a `CycleResult` fits as it is. */
  cycle: DiagramCycle;
  /** 'small' for a card (200 px tall), 'large' for the detail page (280–440 px). Default 'small'. */
  size?: DiagramSize;
  /** Colour of compression and expansion: the candidate's colour. Default: the text colour. */
  colour?: string;
  /** Default: the signed-in user's choice (UnitSystemProvider), SI without one. */
  unitSystem?: UnitSystem;
  /** Width in px. Default: the width the container gives. */
  width?: number;
  /** Prefix of the test ids: `<id>`, `<id>-state-<n>`, `<id>-readout`, `<id>-hit`. Default 'ts-diagram'. */
  testID?: string;
};

/** Stroke colour of a process: heat added copper, heat rejected glacier, work in the loop's colour. */
export function roleColour(role: PathRole, theme: Theme, work: string): string {
  return role === 'heat-added' ? theme.heat : role === 'heat-rejected' ? theme.cold : work;
}

type Active = { index: number; by: 'pointer' | 'focus' } | null;

/** Pointer distance (px) within which a state is read: a touch target's reach for a finger. */
const reach = { mouse: 28, touch: 44 } as const;

/**
 * One candidate's cycle on a T-s diagram: each process as the engine traced it, heat added
 * in copper, heat rejected in glacier, compression and expansion in the candidate's colour;
 * the state numbers in small circles; tap, hover or Tab to a state to read T, p, h, s.
 */
export function TsDiagram({
  name,
  cycle,
  size = 'small',
  colour,
  unitSystem,
  width,
  testID = 'ts-diagram',
}: TsDiagramProps) {
  const theme = useTheme();
  const { system: userSystem } = useUnitSystem();
  const system = unitSystem ?? userSystem;
  const [measured, onLayout] = useMeasuredWidth(width);
  const [active, setActive] = useState<Active>(null);
  const look = tsLook[size];
  const work = colour ?? theme.text;
  const description = describeCycle(name, cycle, system);

  const drawing = useMemo(() => {
    const domain = tsDomain([cycle], system);
    if (!domain || measured <= 0) return null;
    const frame = tsFrame(size, measured);
    const scales = tsScales(domain, frame);
    const projected = projectCycle(cycle, scales, system);
    const markers = placeMarkers(projected.states, look.markerRadius, plotArea(frame));
    return { frame, ticks: tsTicks(scales, frame, size), ...projected, markers };
  }, [cycle, system, size, measured, look.markerRadius]);

  const frameHeight = tsFrame(size, Math.max(measured, 1)).height;
  const units = tsUnits(system);
  const activeState = active && drawing ? drawing.states[active.index]?.state : undefined;

  const onPoint = (at: Point, pointerType: string) => {
    if (!drawing) return;
    const within = pointerType === 'touch' ? reach.touch : reach.mouse;
    const index = nearestPoint(drawing.states, at, within);
    setActive(index === null ? null : { index, by: 'pointer' });
  };

  return (
    <View testID={testID} role="group" aria-label={description} onLayout={onLayout} style={styles.wrap}>
      <View style={{ height: frameHeight }}>
        {drawing ? (
          <>
            <Svg width={drawing.frame.width} height={drawing.frame.height} aria-hidden>
              <Axes
                frame={drawing.frame}
                theme={theme}
                xTicks={drawing.ticks.x}
                yTicks={drawing.ticks.y}
                xTitle={`s, ${units.entropy}`}
                yTitle={`T, ${units.temperature}`}
                fontSize={look.tickFont}
              />
              {drawing.paths.map((p) => (
                <Path
                  key={`${p.from}-${p.to}-${p.kind}`}
                  d={p.d}
                  stroke={roleColour(p.role, theme, work)}
                  strokeWidth={look.stroke}
                  strokeLinejoin="round"
                  strokeLinecap="round"
                  fill="none"
                />
              ))}
              {drawing.states.map((s, i) => {
                const m = drawing.markers[i];
                const moved = Math.hypot(m.x - s.x, m.y - s.y) > look.markerRadius * 0.5;
                const isActive = active?.index === i;
                return (
                  <G key={s.state.n}>
                    {moved ? (
                      <>
                        <Line x1={s.x} y1={s.y} x2={m.x} y2={m.y} stroke={theme.textMuted} strokeWidth={0.75} />
                        <Circle cx={s.x} cy={s.y} r={look.dot} fill={theme.text} />
                      </>
                    ) : null}
                    <Circle
                      cx={m.x}
                      cy={m.y}
                      r={look.markerRadius}
                      fill={isActive ? theme.text : theme.surfaceRaised}
                      stroke={isActive && active?.by === 'focus' ? theme.focus : theme.text}
                      strokeWidth={isActive && active?.by === 'focus' ? 2.5 : 1}
                    />
                    <SvgText
                      x={m.x}
                      y={m.y + look.markerFont * 0.35}
                      fontSize={look.markerFont}
                      fontFamily={fontFamily.monoMedium}
                      fill={isActive ? theme.surfaceRaised : theme.text}
                      textAnchor="middle"
                    >
                      {String(s.state.n)}
                    </SvgText>
                  </G>
                );
              })}
            </Svg>
            {drawing.states.map((s, i) => (
              <FocusTarget
                key={s.state.n}
                at={drawing.markers[i]}
                label={stateSentence(s.state, system)}
                testID={`${testID}-state-${s.state.n}`}
                onFocus={() => setActive({ index: i, by: 'focus' })}
                onBlur={() => setActive((a) => (a?.index === i && a.by === 'focus' ? null : a))}
              />
            ))}
            <HitLayer
              width={drawing.frame.width}
              height={drawing.frame.height}
              testID={`${testID}-hit`}
              onPoint={onPoint}
              onLeave={() => setActive((a) => (a?.by === 'pointer' ? null : a))}
            />
          </>
        ) : cycle.states.length === 0 ? (
          <Text size="small" tone="muted">
            No state points to draw.
          </Text>
        ) : null}
      </View>
      <Readout
        testID={`${testID}-readout`}
        title={activeState ? `State ${activeState.n} · ${activeState.label}` : null}
        items={activeState ? stateQuantities(activeState, system).map((q) => ({ symbol: q.symbol, ...q.shown })) : []}
        hint="Tap, point at or Tab to a state to read T, p, h and s."
      />
      {size === 'large' ? <ProcessKey theme={theme} work={work} /> : null}
    </View>
  );
}

/** What the colours mean, on the detail page. */
export function ProcessKey({ theme, work }: { theme: Theme; work: string }) {
  const entries = [
    { label: 'heat added', colour: theme.heat },
    { label: 'heat rejected', colour: theme.cold },
    { label: 'compression, expansion', colour: work },
  ];
  return (
    <View style={styles.key}>
      {entries.map((e) => (
        <View key={e.label} style={styles.keyEntry}>
          <Swatch colour={e.colour} />
          <Text size="caption" tone="soft">
            {e.label}
          </Text>
        </View>
      ))}
    </View>
  );
}

const styles = StyleSheet.create({
  wrap: { width: '100%' },
  key: { flexDirection: 'row', flexWrap: 'wrap', columnGap: space[2], rowGap: space.half, paddingTop: space.half },
  keyEntry: { flexDirection: 'row', alignItems: 'center', gap: space.half },
});
