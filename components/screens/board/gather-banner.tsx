import { StyleSheet, View } from 'react-native';

import { Button } from '@/components/ui/button';
import { PressableLink } from '@/components/ui/pressable-link';
import { Text } from '@/components/ui/text';
import { useTheme } from '@/components/ui/theme';
import { space } from '@/components/ui/tokens';
import type { Board } from '@/server/contracts/board';

/**
 * Who gathers the room, and what that means for me: follow (with Stop following and
 * Escape), follow again after stopping, or, for the gatherer, Stop gathering.
 */
export function GatherBanner({
  board,
  gatheredName,
  following,
  iGather,
  stopped,
  onStopFollowing,
  onFollowAgain,
  onStopGathering,
  detailHref,
}: {
  board: Board;
  gatheredName: string | undefined;
  following: boolean;
  iGather: boolean;
  stopped: boolean;
  onStopFollowing: () => void;
  onFollowAgain: () => void;
  onStopGathering: () => void;
  detailHref?: string;
}) {
  const t = useTheme();
  const g = board.gathering;
  if (!g || !gatheredName || (!following && !iGather && !stopped)) return null;
  return (
    <View
      style={[styles.banner, { borderColor: t.cold, backgroundColor: t.surfaceRaised }]}
      role="status"
      aria-live="polite"
      testID="gather-banner"
    >
      <Text size="small" style={styles.grow} testID="gather-banner-text">
        {iGather ? (
          <>
            You are gathering the room at <Text weight="semibold">{gatheredName}</Text>.
          </>
        ) : following ? (
          <>
            <Text weight="semibold">{g.by.name}</Text> gathered the room at{' '}
            <Text weight="semibold">{gatheredName}</Text>. You are following.
          </>
        ) : (
          <>
            <Text weight="semibold">{g.by.name}</Text> is gathering the room at{' '}
            <Text weight="semibold">{gatheredName}</Text>. You stopped following.
          </>
        )}
      </Text>
      {iGather ? (
        <Button label="Stop gathering" variant="secondary" small onPress={onStopGathering} testID="gather-stop" />
      ) : following ? (
        <>
          {detailHref ? (
            <PressableLink href={detailHref} accessibilityLabel={`Open ${gatheredName}`} style={styles.bannerLink}>
              <Text size="small" weight="medium" tone="cold">
                Open details
              </Text>
            </PressableLink>
          ) : null}
          <Button
            label="Stop following"
            accessibilityLabel="Stop following (Escape)"
            variant="secondary"
            small
            onPress={onStopFollowing}
            testID="follow-stop"
          />
        </>
      ) : (
        <Button label="Follow again" variant="secondary" small onPress={onFollowAgain} testID="follow-again" />
      )}
    </View>
  );
}

const styles = StyleSheet.create({
  grow: { flex: 1, minWidth: 160 },
  banner: {
    flexDirection: 'row',
    alignItems: 'center',
    flexWrap: 'wrap',
    gap: space[1],
    borderWidth: 1,
    borderLeftWidth: 4,
    borderRadius: 12,
    padding: space[1] + space.half,
  },
  bannerLink: { minHeight: 44, justifyContent: 'center', paddingHorizontal: space[1] },
});
