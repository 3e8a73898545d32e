import { Pressable, ScrollView, StyleSheet, View } from 'react-native';

import { focusRing, type PressState } from '@/components/ui/focus';
import { Text } from '@/components/ui/text';
import { useTheme } from '@/components/ui/theme';
import { space, touchTarget } from '@/components/ui/tokens';
import type { Matrix } from '@/server/contracts/matrix';

import type { CellModel, RowModel, Sort } from './matrix-model';

const labelWidthPhone = 136;
const labelWidthWide = 240;
const cellWidth = 132;
const rowHeight = 72;
const headHeight = 56;
const bandHeight = 48;

type Props = {
  matrix: Matrix;
  rows: RowModel[];
  order: string[];
  sort: Sort;
  onSort: (rowKey: string) => void;
  wide: boolean;
};

/**
 * Candidates as columns, one line per figure, site-year figure, criterion, total, rank and
 * round; a titled group (the site year) opens with a band. On a phone
 * the label column stays while the candidate columns swipe sideways; wide, it is one table.
 * Tapping (or Enter on) a row's label sorts the candidates by that row; again reverses.
 */
export function MatrixTable({ matrix, rows, order, sort, onSort, wide }: Props) {
  const t = useTheme();
  const byId = new Map(matrix.candidates.map((c) => [c.id, c]));
  const labelWidth = wide ? labelWidthWide : labelWidthPhone;

  const head = (id: string) => {
    const c = byId.get(id)!;
    return (
      <View
        key={id}
        style={[styles.head, wide ? styles.flexCell : { width: cellWidth }, { borderTopColor: c.colour }]}
        testID={`matrix-head-${id}`}
      >
        <Text size="small" weight="semibold" numberOfLines={2}>
          {c.name}
        </Text>
      </View>
    );
  };

  const cell = (row: RowModel, id: string) => {
    const m: CellModel = row.cells[id]!;
    return (
      <View
        key={id}
        style={[
          styles.cell,
          wide ? styles.flexCell : { width: cellWidth },
          { borderBottomColor: t.hairline },
          row.kind === 'total' || row.kind === 'rank' ? { backgroundColor: t.surfaceRaised } : null,
        ]}
        testID={`matrix-cell-${row.key}-${id}`}
      >
        <Text
          size="small"
          mono={!m.missing}
          tone={m.missing ? 'muted' : 'default'}
          weight={row.kind === 'total' ? 'semibold' : 'regular'}
        >
          {m.value}
          {m.unit ? (
            <Text size="caption" tone="soft">
              {' '}
              {m.unit}
            </Text>
          ) : null}
        </Text>
        {m.note ? (
          <Text size="caption" tone={m.flag === 'incomplete' ? 'warning' : 'muted'} numberOfLines={2}>
            {m.note}
          </Text>
        ) : null}
      </View>
    );
  };

  const label = (row: RowModel) => {
    const active = sort?.rowKey === row.key;
    const arrow = active ? (sort!.reversed ? ' ↑' : ' ↓') : '';
    return (
      <Pressable
        key={row.key}
        role="button"
        accessibilityLabel={`Sort candidates by ${row.label}${active ? (sort!.reversed ? ', reversed' : '') : ''}`}
        onPress={() => onSort(row.key)}
        testID={`matrix-sort-${row.key}`}
        style={({ focused, hovered }: PressState) => [
          styles.label,
          { width: labelWidth, borderBottomColor: t.hairline, backgroundColor: hovered ? t.surfaceSunk : t.surface },
          focused && focusRing(t, true),
        ]}
      >
        <Text size="small" weight={active ? 'semibold' : 'medium'} numberOfLines={2}>
          {row.label}
          {arrow}
        </Text>
        {row.sub ? (
          <Text size="caption" tone="muted" numberOfLines={1}>
            {row.sub}
          </Text>
        ) : null}
      </Pressable>
    );
  };

  /** A titled group's band: the title in the label column, the caption beside it. */
  const bandTitle = (row: RowModel) => (
    <View
      key={`band-${row.key}`}
      style={[styles.band, { width: labelWidth, borderBottomColor: t.hairline, backgroundColor: t.surfaceSunk }]}
      testID={`matrix-group-${row.key}`}
    >
      <Text size="small" weight="semibold">
        {row.group!.title}
      </Text>
    </View>
  );
  const bandCaption = (row: RowModel, style: object) => (
    <View
      key={`band-caption-${row.key}`}
      style={[styles.band, style, { borderBottomColor: t.hairline, backgroundColor: t.surfaceSunk }]}
    >
      <Text size="caption" tone="soft" numberOfLines={2} testID={`matrix-group-caption-${row.key}`}>
        {row.group!.caption}
      </Text>
    </View>
  );

  const corner = (
    <View style={[styles.head, { width: labelWidth, borderTopColor: 'transparent' }]}>
      <Text size="caption" tone="muted">
        Tap a row to sort
      </Text>
    </View>
  );

  if (wide) {
    return (
      <View style={[styles.table, { borderColor: t.hairline }]} testID="matrix-table" role="table">
        <View style={styles.row}>
          {corner}
          {order.map(head)}
        </View>
        {rows.map((row) => [
          row.group ? (
            <View key={`band-${row.key}`} style={styles.row}>
              {bandTitle(row)}
              {bandCaption(row, styles.flexCell)}
            </View>
          ) : null,
          <View key={row.key} style={styles.row} testID={`matrix-row-${row.key}`}>
            {label(row)}
            {order.map((id) => cell(row, id))}
          </View>,
        ])}
      </View>
    );
  }

  return (
    <View style={[styles.table, styles.row, { borderColor: t.hairline }]} testID="matrix-table" role="table">
      <View style={[styles.stuck, { borderRightColor: t.hairline }]}>
        {corner}
        {rows.map((row) => [row.group ? bandTitle(row) : null, label(row)])}
      </View>
      <ScrollView horizontal testID="matrix-columns" showsHorizontalScrollIndicator>
        <View>
          <View style={styles.row}>{order.map(head)}</View>
          {rows.map((row) => [
            row.group ? bandCaption(row, { width: Math.max(1, order.length) * cellWidth }) : null,
            <View key={row.key} style={styles.row} testID={`matrix-row-${row.key}`}>
              {order.map((id) => cell(row, id))}
            </View>,
          ])}
        </View>
      </ScrollView>
    </View>
  );
}

const styles = StyleSheet.create({
  table: { borderWidth: 1, borderRadius: 12, overflow: 'hidden' },
  row: { flexDirection: 'row' },
  stuck: { borderRightWidth: 1 },
  head: {
    height: headHeight,
    borderTopWidth: 4,
    paddingHorizontal: space[1],
    justifyContent: 'center',
  },
  flexCell: { flex: 1, minWidth: 112 },
  label: {
    height: rowHeight,
    minHeight: touchTarget,
    paddingHorizontal: space[1],
    justifyContent: 'center',
    borderBottomWidth: 1,
  },
  band: {
    height: bandHeight,
    paddingHorizontal: space[1],
    justifyContent: 'center',
    borderBottomWidth: 1,
  },
  cell: {
    height: rowHeight,
    paddingHorizontal: space[1],
    justifyContent: 'center',
    borderBottomWidth: 1,
  },
});
