/**
 * Parts every diagram shares: the measured width, the axes (ticks, labels, titles), the
 * transparent layer that turns a pointer or a tap into a point, and the readout under the plot.
 */
import { useCallback, useState, type ComponentProps, type ReactNode } from 'react';
import { StyleSheet, View, type LayoutChangeEvent, type PointerEvent } from 'react-native';
import { G, Line, Text as SvgText } from 'react-native-svg';

import { Quantity, Text } from '@/components/ui/text';
import type { Theme } from '@/components/ui/themes';
import { fontFamily, space } from '@/components/ui/tokens';

import { plotArea, type Point, type Tick } from './scales';
import type { Frame } from './types';

/** The given width, or the container's own once it has been laid out (0 before). */
export function useMeasuredWidth(width?: number): [number, (e: LayoutChangeEvent) => void] {
  const [measured, setMeasured] = useState(0);
  const onLayout = useCallback((e: LayoutChangeEvent) => {
    const next = Math.round(e.nativeEvent.layout.width);
    setMeasured((previous) => (previous === next ? previous : next));
  }, []);
  return [width ?? measured, onLayout];
}

type AxesProps = {
  frame: Frame;
  theme: Theme;
  xTicks: readonly Tick[];
  yTicks: readonly Tick[];
  xTitle: string;
  yTitle: string;
  fontSize: number;
  /** Draw the x tick labels and title (the upper panel of a stacked chart leaves them out). */
  xLabels?: boolean;
};

/** Hairline axes at the plot's left and bottom, faint grid lines, ticks in Plex Mono, titles with units. */
export function Axes({ frame, theme, xTicks, yTicks, xTitle, yTitle, fontSize, xLabels = true }: AxesProps) {
  const area = plotArea(frame);
  return (
    <G>
      {yTicks.map((t) => (
        <G key={`y${t.value}`}>
          <Line x1={area.left} x2={area.right} y1={t.at} y2={t.at} stroke={theme.hairline} strokeWidth={0.5} />
          <SvgText
            x={area.left - 6}
            y={t.at + fontSize * 0.35}
            fontSize={fontSize}
            fontFamily={fontFamily.mono}
            fill={theme.textSoft}
            textAnchor="end"
          >
            {t.label}
          </SvgText>
        </G>
      ))}
      {xTicks.map((t) => (
        <G key={`x${t.value}`}>
          <Line x1={t.at} x2={t.at} y1={area.top} y2={area.bottom} stroke={theme.hairline} strokeWidth={0.5} />
          {xLabels ? (
            <SvgText
              x={t.at}
              y={area.bottom + fontSize + 6}
              fontSize={fontSize}
              fontFamily={fontFamily.mono}
              fill={theme.textSoft}
              textAnchor="middle"
            >
              {t.label}
            </SvgText>
          ) : null}
        </G>
      ))}
      <Line x1={area.left} x2={area.left} y1={area.top} y2={area.bottom} stroke={theme.textMuted} strokeWidth={1} />
      <Line x1={area.left} x2={area.right} y1={area.bottom} y2={area.bottom} stroke={theme.textMuted} strokeWidth={1} />
      <SvgText
        x={area.left - 6}
        y={area.top - 8}
        fontSize={fontSize}
        fontFamily={fontFamily.sansMedium}
        fill={theme.textSoft}
        textAnchor="start"
      >
        {yTitle}
      </SvgText>
      {xLabels ? (
        <SvgText
          x={area.right}
          y={area.bottom + 2 * fontSize + 14}
          fontSize={fontSize}
          fontFamily={fontFamily.sansMedium}
          fill={theme.textSoft}
          textAnchor="end"
        >
          {xTitle}
        </SvgText>
      ) : null}
    </G>
  );
}

/**
 * Text drawn over a line: a stroke in the surface colour under the letters keeps them
 * readable where a curve runs through them.
 */
export function HaloText({ halo, children, ...props }: ComponentProps<typeof SvgText> & { halo: string }) {
  return (
    <G>
      <SvgText {...props} fill={halo} stroke={halo} strokeWidth={3} strokeLinejoin="round">
        {children}
      </SvgText>
      <SvgText {...props}>{children}</SvgText>
    </G>
  );
}

type HitLayerProps = {
  width: number;
  height: number;
  /** A pointer moved, pressed or tapped at this point (px in the drawing). */
  onPoint: (at: Point, pointerType: string) => void;
  /** A mouse left the drawing. */
  onLeave: () => void;
  testID?: string;
};

/**
 * A transparent layer over the drawing with no children, so a pointer's offset is measured
 * from the drawing's corner. Mouse and pen follow hover; touch reads on the tap and leaves
 * the page free to scroll or page sideways.
 */
export function HitLayer({ width, height, onPoint, onLeave, testID }: HitLayerProps) {
  const point = (e: PointerEvent) =>
    onPoint({ x: e.nativeEvent.offsetX, y: e.nativeEvent.offsetY }, e.nativeEvent.pointerType);
  return (
    <View
      testID={testID}
      aria-hidden
      style={[StyleSheet.absoluteFill, { width, height }]}
      onPointerDown={point}
      onPointerMove={(e) => {
        if (e.nativeEvent.pointerType !== 'touch') point(e);
      }}
      onPointerLeave={(e) => {
        if (e.nativeEvent.pointerType !== 'touch') onLeave();
      }}
    />
  );
}

type FocusTargetProps = {
  at: Point;
  label: string;
  onFocus: () => void;
  onBlur: () => void;
  testID?: string;
};

const focusTargetSize = 24;

/**
 * A keyboard stop for one state, under the hit layer (so pointers pass it by); its label is
 * what a screen reader reads, and focus moves the readout to it.
 */
export function FocusTarget({ at, label, onFocus, onBlur, testID }: FocusTargetProps) {
  return (
    <View
      focusable
      testID={testID}
      aria-label={label}
      role="button"
      onFocus={onFocus}
      onBlur={onBlur}
      style={[styles.focusTarget, { left: at.x - focusTargetSize / 2, top: at.y - focusTargetSize / 2 }]}
    />
  );
}

export type ReadoutItem = { symbol: string; value: string; unit: string };

type ReadoutProps = {
  /** What is read: "State 3 · combustor exit". Null shows the hint. */
  title: string | null;
  items?: readonly ReadoutItem[];
  hint: string;
  /** Shown in the danger tone instead of the items (a refused sweep sample). */
  note?: string | null;
  testID?: string;
  /** Something drawn before the title, such as a candidate's colour. */
  lead?: ReactNode;
};

/** The small readout under a diagram; its height is kept so the page does not jump. */
export function Readout({ title, items = [], hint, note, testID, lead }: ReadoutProps) {
  return (
    <View style={styles.readout} testID={testID}>
      {title === null ? (
        <Text size="caption" tone="muted">
          {hint}
        </Text>
      ) : (
        <>
          <View style={styles.readoutTitle}>
            {lead}
            <Text size="caption" weight="medium" tone="soft">
              {title}
            </Text>
          </View>
          {note ? (
            <Text size="caption" tone="danger">
              {note}
            </Text>
          ) : (
            <View style={styles.readoutItems}>
              {items.map((item) => (
                <Text key={item.symbol} size="small">
                  <Text size="small" tone="soft">{`${item.symbol} `}</Text>
                  <Quantity size="small" value={item.value} unit={item.unit} />
                </Text>
              ))}
            </View>
          )}
        </>
      )}
    </View>
  );
}

/** A short stroke of a colour, for keys and legends; dashed as three short strokes. */
export function Swatch({ colour, dashed = false }: { colour: string; dashed?: boolean }) {
  if (dashed) {
    return (
      <View style={styles.dashes}>
        {[0, 1, 2].map((i) => (
          <View key={i} style={[styles.dash, { backgroundColor: colour }]} />
        ))}
      </View>
    );
  }
  return <View style={[styles.swatch, { backgroundColor: colour }]} />;
}

/** One entry of a diagram's key below the plot: the line's swatch and what it is. */
export function KeyEntry({ label, colour, dashed }: { label: string; colour: string; dashed?: boolean }) {
  return (
    <View style={styles.keyEntry}>
      <Swatch colour={colour} dashed={dashed} />
      <Text size="caption" tone="soft">
        {label}
      </Text>
    </View>
  );
}

const styles = StyleSheet.create({
  keyEntry: { flexDirection: 'row', alignItems: 'center', gap: space.half },
  focusTarget: { position: 'absolute', width: focusTargetSize, height: focusTargetSize, borderRadius: 12 },
  readout: { minHeight: 64, paddingTop: space[1], gap: 2 },
  readoutTitle: { flexDirection: 'row', alignItems: 'center', gap: space.half },
  readoutItems: { flexDirection: 'row', flexWrap: 'wrap', columnGap: space[2], rowGap: 0 },
  swatch: { width: 16, height: 3, borderRadius: 2 },
  dashes: { width: 16, height: 3, flexDirection: 'row', justifyContent: 'space-between' },
  dash: { width: 4, height: 2 },
});
