import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { StyleSheet, View } from 'react-native';
import { z } from 'zod';

import { useUpdateReviewMutation } from '@/components/data/reviews';
import { Badge } from '@/components/ui/badge';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { FormError, FormField } from '@/components/ui/field';
import { formatDate } from '@/components/ui/format';
import { useMessage } from '@/components/ui/message';
import { Heading, Text } from '@/components/ui/text';
import { space } from '@/components/ui/tokens';
import { setServerErrors } from '@/components/ui/use-field';
import { reviewName, reviewSummary, type Review } from '@/server/contracts/review';
import { roleAllows, roleLabels, type TeamRole } from '@/server/contracts/roles';

const detailsForm = z.object({ name: reviewName, summary: reviewSummary });

/**
 * The Review itself, opened from the board's header: status, who started it, the summary;
 * rename and edit the summary (Owner, Lead), archive or restore it (Owner, Lead).
 */
export function ReviewDetails({ review, myRole, onClose }: { review: Review; myRole: TeamRole; onClose: () => void }) {
  const update = useUpdateReviewMutation();
  const message = useMessage();
  const canEdit = roleAllows(myRole, { review: ['update'] });
  const canArchive = roleAllows(myRole, { review: ['archive'] });
  const archived = review.status === 'archived';
  const { control, handleSubmit, setError, formState, reset } = useForm({
    resolver: zodResolver(detailsForm),
    mode: 'onChange',
    defaultValues: { name: review.name, summary: review.summary },
  });

  const save = handleSubmit(async (v) => {
    const patch = {
      ...(v.name !== review.name ? { name: v.name } : {}),
      ...(v.summary !== review.summary ? { summary: v.summary } : {}),
    };
    if (Object.keys(patch).length === 0) return;
    try {
      const saved = await update.mutateAsync({ reviewId: review.id, patch });
      reset({ name: saved.name, summary: saved.summary });
      message.show('Review details saved.');
    } catch (error) {
      setServerErrors(error, setError, ['name', 'summary']);
    }
  });
  const saving = formState.isSubmitting;

  const setStatus = (status: 'active' | 'archived') =>
    update.mutate(
      { reviewId: review.id, patch: { status } },
      {
        onSuccess: () =>
          message.show(status === 'archived' ? `“${review.name}” archived.` : `“${review.name}” restored.`),
        onError: message.showError,
      },
    );

  return (
    <Card style={styles.card} testID="review-details">
      <View style={styles.row}>
        <Heading level={2} style={styles.grow}>
          Review details
        </Heading>
        <Button label="Close" variant="quiet" small onPress={onClose} testID="review-details-close" />
      </View>
      <View style={styles.meta}>
        <Badge label={archived ? 'Archived' : 'Active'} tone={archived ? 'warning' : 'good'} testID="review-status" />
        <Text size="small" tone="muted">
          You are {roleLabels[myRole]} · started {formatDate(review.createdAt)}
          {review.createdBy ? ` by ${review.createdBy.name}` : ''}
        </Text>
      </View>
      {canEdit ? (
        <>
          <FormField control={control} name="name" label="Review name" maxLength={140} testID="review-details-name" />
          <FormField
            control={control}
            name="summary"
            label="Summary"
            multiline
            numberOfLines={3}
            testID="review-details-summary"
          />
          <FormError message={formState.errors.root?.server?.message} testID="review-details-error" />
          <View style={styles.actions}>
            {canArchive ? (
              <Button
                label={archived ? 'Restore review' : 'Archive review'}
                variant={archived ? 'secondary' : 'danger'}
                busy={update.isPending && !saving}
                onPress={() => setStatus(archived ? 'active' : 'archived')}
                testID="review-details-archive"
              />
            ) : null}
            <Button
              label="Save details"
              busy={saving}
              disabled={!formState.isDirty}
              onPress={() => {
                if (!saving) void save();
              }}
              testID="review-details-save"
            />
          </View>
        </>
      ) : (
        <Text tone={review.summary ? 'default' : 'muted'} testID="review-summary">
          {review.summary || 'No summary yet.'}
        </Text>
      )}
    </Card>
  );
}

const styles = StyleSheet.create({
  card: { gap: space[2] },
  row: { flexDirection: 'row', alignItems: 'center', gap: space[1] },
  grow: { flex: 1 },
  meta: { flexDirection: 'row', alignItems: 'center', gap: space[1] + space.half, flexWrap: 'wrap' },
  actions: { flexDirection: 'row', justifyContent: 'flex-end', gap: space[1], flexWrap: 'wrap' },
});
