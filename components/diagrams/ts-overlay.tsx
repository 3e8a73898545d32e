import { useMemo, useState } from 'react';
import { StyleSheet, View } from 'react-native';
import Svg, { Circle, G, Path } from 'react-native-svg';

import type { UnitSystem } from '@/components/ui/format';
import { Text } from '@/components/ui/text';
import { useTheme } from '@/components/ui/theme';
import { space } from '@/components/ui/tokens';
import { useUnitSystem } from '@/components/ui/unit-system';

import { Axes, FocusTarget, HitLayer, Readout, Swatch, useMeasuredWidth } from './diagram-parts';
import { nearestPoint, type Point } from './scales';
import {
  describeOverlay,
  projectCycle,
  stateQuantities,
  stateSentence,
  tsDomain,
  tsFrame,
  tsLook,
  tsScales,
  tsTicks,
  tsUnits,
  type ProjectedState,
} from './ts-geometry';
import type { DiagramSize, OverlayCandidate } from './types';

export type TsOverlayProps = {
  /** Every candidate to draw, in the board's order, each with its own colour. */
  candidates: readonly OverlayCandidate[];
  /** Default 'large'. */
  size?: DiagramSize;
  /** Default: the signed-in user's choice (UnitSystemProvider), SI without one. */
  unitSystem?: UnitSystem;
  /** Width in px. Default: the width the container gives. */
  width?: number;
  /**
   * Prefix of the test ids: `<id>`, `<id>-state-<candidate id>-<n>`, `<id>-readout`, `<id>-hit`,
   * `<id>-legend`. Default 'ts-overlay'.
   */
  testID?: string;
};

type Mark = ProjectedState & { candidate: OverlayCandidate };
type Active = { index: number; by: 'pointer' | 'focus' } | null;

const reach = { mouse: 28, touch: 44 } as const;

/**
 * Every candidate's loop on one T-s diagram, each in the colour it keeps across the app, with
 * a legend of names; tap, hover or Tab to a state to read it with the candidate's name.
 */
export function TsOverlay({ candidates, size = 'large', unitSystem, width, testID = 'ts-overlay' }: TsOverlayProps) {
  const theme = useTheme();
  const { system: userSystem } = useUnitSystem();
  const system = unitSystem ?? userSystem;
  const [measured, onLayout] = useMeasuredWidth(width);
  const [active, setActive] = useState<Active>(null);
  const look = tsLook[size];
  const description = describeOverlay(candidates, system);

  const drawing = useMemo(() => {
    const domain = tsDomain(
      candidates.map((c) => c.cycle),
      system,
    );
    if (!domain || measured <= 0) return null;
    const frame = tsFrame(size, measured);
    const scales = tsScales(domain, frame);
    const loops = candidates.map((candidate) => ({ candidate, ...projectCycle(candidate.cycle, scales, system) }));
    const marks: Mark[] = loops.flatMap((loop) => loop.states.map((s) => ({ ...s, candidate: loop.candidate })));
    return { frame, ticks: tsTicks(scales, frame, size), loops, marks };
  }, [candidates, system, size, measured]);

  const frameHeight = tsFrame(size, Math.max(measured, 1)).height;
  const units = tsUnits(system);
  const activeMark = active && drawing ? drawing.marks[active.index] : undefined;

  const onPoint = (at: Point, pointerType: string) => {
    if (!drawing) return;
    const index = nearestPoint(drawing.marks, at, pointerType === 'touch' ? reach.touch : reach.mouse);
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
              {drawing.loops.map((loop) => {
                const dimmed = activeMark !== undefined && activeMark.candidate.id !== loop.candidate.id;
                return (
                  <G key={loop.candidate.id} opacity={dimmed ? 0.45 : 1}>
                    {loop.paths.map((p) => (
                      <Path
                        key={`${p.from}-${p.to}-${p.kind}`}
                        d={p.d}
                        stroke={loop.candidate.colour}
                        strokeWidth={look.stroke}
                        strokeLinejoin="round"
                        strokeLinecap="round"
                        fill="none"
                      />
                    ))}
                    {loop.states.map((s) => (
                      <Circle
                        key={s.state.n}
                        cx={s.x}
                        cy={s.y}
                        r={look.dot + 0.5}
                        fill={loop.candidate.colour}
                        stroke={theme.surfaceRaised}
                        strokeWidth={1}
                      />
                    ))}
                  </G>
                );
              })}
              {activeMark ? (
                <Circle
                  cx={activeMark.x}
                  cy={activeMark.y}
                  r={look.markerRadius - 2}
                  fill="none"
                  stroke={active?.by === 'focus' ? theme.focus : theme.text}
                  strokeWidth={2}
                />
              ) : null}
            </Svg>
            {drawing.marks.map((m, i) => (
              <FocusTarget
                key={`${m.candidate.id}-${m.state.n}`}
                at={m}
                label={`${m.candidate.name}: ${stateSentence(m.state, system)}`}
                testID={`${testID}-state-${m.candidate.id}-${m.state.n}`}
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
        ) : candidates.length === 0 ? (
          <Text size="small" tone="muted">
            No candidates to draw.
          </Text>
        ) : null}
      </View>
      <Readout
        testID={`${testID}-readout`}
        lead={activeMark ? <Swatch colour={activeMark.candidate.colour} /> : null}
        title={
          activeMark ? `${activeMark.candidate.name} · state ${activeMark.state.n} · ${activeMark.state.label}` : null
        }
        items={
          activeMark ? stateQuantities(activeMark.state, system).map((q) => ({ symbol: q.symbol, ...q.shown })) : []
        }
        hint="Tap, point at or Tab to a state to read the candidate, T, p, h and s."
      />
      <View style={styles.legend} testID={`${testID}-legend`}>
        {candidates.map((c) => (
          <View key={c.id} style={styles.legendEntry}>
            <Swatch colour={c.colour} />
            <Text size="caption">{c.name}</Text>
          </View>
        ))}
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  wrap: { width: '100%' },
  legend: { flexDirection: 'row', flexWrap: 'wrap', columnGap: space[2], rowGap: space.half, paddingTop: space.half },
  legendEntry: { flexDirection: 'row', alignItems: 'center', gap: space.half },
});
