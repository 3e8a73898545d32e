import { useState } from 'react';
import { StyleSheet, View } from 'react-native';

import { useUpdateReviewMutation } from '@/components/data/reviews';
import { Badge } from '@/components/ui/badge';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { Field } from '@/components/ui/field';
import { focusRing, type PressState } from '@/components/ui/focus';
import { formatAgo } from '@/components/ui/format';
import { useMessage } from '@/components/ui/message';
import { PressableLink } from '@/components/ui/pressable-link';
import { Text } from '@/components/ui/text';
import { useTheme } from '@/components/ui/theme';
import { space } from '@/components/ui/tokens';
import { showFieldErrors, useField } from '@/components/ui/use-field';
import { reviewName, type Review } from '@/server/contracts/review';

/** One Review in the list: opens on press; rename inline and archive / restore for Owner and Lead. */
export function ReviewCard({ review, canEdit, canArchive }: { review: Review; canEdit: boolean; canArchive: boolean }) {
  const t = useTheme();
  const [renaming, setRenaming] = useState(false);
  const name = useField(reviewName, review.name);
  const update = useUpdateReviewMutation();
  const message = useMessage();
  const archived = review.status === 'archived';

  const saveName = () => {
    if (!name.validate()) return;
    if (name.value.trim() === review.name) {
      setRenaming(false);
      return;
    }
    update.mutate(
      { reviewId: review.id, patch: { name: name.value.trim() } },
      {
        onSuccess: () => setRenaming(false),
        onError: (error) => {
          if (showFieldErrors(error, { name }) !== null) message.showError(error);
        },
      },
    );
  };

  const setStatus = (status: 'active' | 'archived') =>
    update.mutate(
      { reviewId: review.id, patch: { status } },
      {
        onSuccess: () =>
          message.show(status === 'archived' ? `“${review.name}” archived.` : `“${review.name}” restored.`, {
            action: {
              label: 'Undo',
              onPress: () =>
                update.mutate(
                  { reviewId: review.id, patch: { status: status === 'archived' ? 'active' : 'archived' } },
                  { onError: message.showError },
                ),
            },
          }),
        onError: message.showError,
      },
    );

  return (
    <Card testID={`review-card-${review.id}`} style={[styles.card, archived && { backgroundColor: t.surfaceSunk }]}>
      {renaming ? (
        <View style={styles.renameBox}>
          <Field
            label="Review name"
            value={name.value}
            onChangeText={name.setValue}
            error={name.error}
            autoFocus
            maxLength={140}
            onSubmitEditing={saveName}
            onKeyPress={(e) => {
              if ((e.nativeEvent as { key?: string }).key === 'Escape') {
                name.reset(review.name);
                setRenaming(false);
              }
            }}
            testID="review-rename-input"
          />
          <View style={styles.actions}>
            <Button
              label="Cancel"
              variant="quiet"
              small
              onPress={() => {
                name.reset(review.name);
                setRenaming(false);
              }}
              testID="review-rename-cancel"
            />
            <Button label="Save name" small busy={update.isPending} onPress={saveName} testID="review-rename-save" />
          </View>
        </View>
      ) : (
        <PressableLink
          href={`/reviews/${review.id}`}
          accessibilityLabel={`Open review ${review.name}`}
          testID={`review-open-${review.id}`}
          style={({ hovered, focused }: PressState) => [
            styles.open,
            hovered && { opacity: 0.8 },
            focused && focusRing(t),
          ]}
        >
          <View style={styles.titleRow}>
            <Text size="title" weight="semibold" style={styles.title} testID="review-name">
              {review.name}
            </Text>
            {archived ? <Badge label="Archived" tone="warning" /> : null}
          </View>
          {review.summary ? (
            <Text tone="soft" numberOfLines={2}>
              {review.summary}
            </Text>
          ) : null}
          <Text size="small" tone="muted">
            {review.createdBy ? `Started by ${review.createdBy.name} · ` : ''}updated {formatAgo(review.updatedAt)}
          </Text>
        </PressableLink>
      )}
      {!renaming && (canEdit || canArchive) ? (
        <View style={[styles.actions, { borderTopColor: t.hairline }, styles.footer]}>
          {canEdit && !archived ? (
            <Button
              label="Rename"
              accessibilityLabel={`Rename ${review.name}`}
              variant="quiet"
              small
              onPress={() => {
                name.reset(review.name);
                setRenaming(true);
              }}
              testID={`review-rename-${review.id}`}
            />
          ) : null}
          {canArchive ? (
            <Button
              label={archived ? 'Restore' : 'Archive'}
              accessibilityLabel={`${archived ? 'Restore' : 'Archive'} ${review.name}`}
              variant="quiet"
              small
              busy={update.isPending && !renaming}
              onPress={() => setStatus(archived ? 'active' : 'archived')}
              testID={`review-${archived ? 'restore' : 'archive'}-${review.id}`}
            />
          ) : null}
        </View>
      ) : null}
    </Card>
  );
}

const styles = StyleSheet.create({
  card: { padding: 0 },
  open: { padding: space[2], gap: space.half + 2 },
  titleRow: { flexDirection: 'row', alignItems: 'center', gap: space[1], flexWrap: 'wrap' },
  title: { flexShrink: 1 },
  renameBox: { padding: space[2], gap: space[1] },
  actions: { flexDirection: 'row', justifyContent: 'flex-end', gap: space[1] },
  footer: { borderTopWidth: 1, paddingHorizontal: space[1], paddingVertical: space.half },
});
