import { useEffect, useRef, useState, type ReactNode } from 'react';
import {
  Pressable,
  ScrollView,
  StyleSheet,
  View,
  type NativeScrollEvent,
  type NativeSyntheticEvent,
} from 'react-native';

import { Button } from '@/components/ui/button';
import { focusRing, type PressState } from '@/components/ui/focus';
import { Text } from '@/components/ui/text';
import { useTheme } from '@/components/ui/theme';
import { space, touchTarget } from '@/components/ui/tokens';

/**
 * The phone's board: one card per page, swiped sideways on touch, with arrow buttons and
 * page dots that name each candidate. `index` is the page shown; a page the person moves to
 * themselves (swipe, arrow, dot) is reported through `onPage`, a move made by code is not.
 */
export function CardPager({
  pages,
  index,
  onPage,
  children,
}: {
  pages: Array<{ id: string; name: string; colour: string }>;
  index: number;
  onPage: (index: number) => void;
  children: (page: number) => ReactNode;
}) {
  const t = useTheme();
  const scroller = useRef<ScrollView>(null);
  const [width, setWidth] = useState(0);
  const commanded = useRef<number | null>(null);
  const settle = useRef<ReturnType<typeof setTimeout> | null>(null);

  // Move to the page shown when it changes from outside (a follow, an arrow, a new candidate).
  useEffect(() => {
    if (!width) return;
    commanded.current = index;
    scroller.current?.scrollTo({ x: index * width, animated: true });
  }, [index, width]);

  useEffect(
    () => () => {
      if (settle.current) clearTimeout(settle.current);
    },
    [],
  );

  const onScroll = (e: NativeSyntheticEvent<NativeScrollEvent>) => {
    const x = e.nativeEvent.contentOffset.x;
    if (settle.current) clearTimeout(settle.current);
    settle.current = setTimeout(() => {
      if (!width) return;
      const page = Math.max(0, Math.min(pages.length - 1, Math.round(x / width)));
      if (commanded.current !== null) {
        // The scroll we asked for has landed (or was overtaken by a swipe to another page).
        const asked = commanded.current;
        commanded.current = null;
        if (page === asked) return;
      }
      if (page !== index) onPage(page);
    }, 140);
  };

  const current = pages[index];
  return (
    <View style={styles.wrap} testID="card-pager">
      <ScrollView
        ref={scroller}
        horizontal
        pagingEnabled
        showsHorizontalScrollIndicator={false}
        onLayout={(e) => setWidth(Math.round(e.nativeEvent.layout.width))}
        onScroll={onScroll}
        scrollEventThrottle={32}
        accessibilityLabel="Candidates, one per page"
        testID="card-pager-scroll"
      >
        {pages.map((p, i) => (
          <View
            key={p.id}
            style={[styles.page, { width: width || undefined }]}
            aria-hidden={i !== index}
            testID={`page-${p.id}`}
          >
            {children(i)}
          </View>
        ))}
      </ScrollView>
      <View style={styles.controls}>
        <Button
          label="‹"
          accessibilityLabel={index > 0 ? `Previous candidate: ${pages[index - 1]!.name}` : 'Previous candidate'}
          variant="secondary"
          disabled={index <= 0}
          onPress={() => onPage(index - 1)}
          testID="pager-previous"
        />
        <View style={styles.middle}>
          <View style={styles.dots} role="tablist" accessibilityLabel="Pages">
            {pages.map((p, i) => (
              <Pressable
                key={p.id}
                role="tab"
                aria-selected={i === index}
                accessibilityLabel={`${p.name}, candidate ${i + 1} of ${pages.length}`}
                onPress={() => onPage(i)}
                testID={`pager-dot-${p.id}`}
                style={({ focused }: PressState) => [styles.dotTarget, focused && focusRing(t, true)]}
              >
                <View
                  style={[
                    styles.dot,
                    { backgroundColor: p.colour, borderColor: t.text },
                    i === index ? styles.dotOn : { opacity: 0.45 },
                  ]}
                />
              </Pressable>
            ))}
          </View>
          <Text size="caption" tone="soft" numberOfLines={1} testID="pager-current" aria-live="polite">
            {current ? `${index + 1} of ${pages.length} · ${current.name}` : ''}
          </Text>
        </View>
        <Button
          label="›"
          accessibilityLabel={index < pages.length - 1 ? `Next candidate: ${pages[index + 1]!.name}` : 'Next candidate'}
          variant="secondary"
          disabled={index >= pages.length - 1}
          onPress={() => onPage(index + 1)}
          testID="pager-next"
        />
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  wrap: { gap: space[1] },
  page: { paddingHorizontal: 2 },
  controls: { flexDirection: 'row', alignItems: 'center', gap: space[1] },
  middle: { flex: 1, alignItems: 'center', minWidth: 0 },
  dots: { flexDirection: 'row', flexWrap: 'wrap', justifyContent: 'center' },
  dotTarget: { minWidth: touchTarget, minHeight: touchTarget, alignItems: 'center', justifyContent: 'center' },
  dot: { width: 10, height: 10, borderRadius: 5 },
  dotOn: { width: 14, height: 14, borderRadius: 7, borderWidth: 2 },
});
