import { useState } from 'react';
import { StyleSheet, View } from 'react-native';

import { useCreateReviewMutation } from '@/components/data/reviews';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { Field, FormError } from '@/components/ui/field';
import { useMessage } from '@/components/ui/message';
import { Heading, Text } from '@/components/ui/text';
import { space } from '@/components/ui/tokens';
import { showFieldErrors, useField } from '@/components/ui/use-field';
import { createReviewInput } from '@/server/contracts/review';

/** Name and summary, checked with the server's own schema as you type; a taken name shows at the name. */
export function CreateReviewForm({ teamId, onDone }: { teamId: string; onDone: () => void }) {
  const name = useField(createReviewInput.shape.name);
  const summary = useField(createReviewInput.shape.summary);
  const create = useCreateReviewMutation(teamId);
  const message = useMessage();
  const [formError, setFormError] = useState<string | null>(null);

  const submit = () => {
    const ok = [name.validate(), summary.validate()].every(Boolean);
    if (!ok) return;
    setFormError(null);
    create.mutate(
      { name: name.value.trim(), summary: summary.value.trim() },
      {
        onSuccess: (review) => {
          message.show(`Review “${review.name}” created.`);
          name.reset();
          summary.reset();
          onDone();
        },
        onError: (error) => setFormError(showFieldErrors(error, { name, summary })),
      },
    );
  };

  return (
    <Card style={styles.card} testID="create-review-form">
      <Heading level={2}>New review</Heading>
      <Text size="small" tone="soft">
        One Review is one concept-selection effort: its Design basis, its Candidates and the Decision record.
      </Text>
      <Field
        label="Review name"
        placeholder="e.g. Unit 3 peaking — cycle choice"
        value={name.value}
        onChangeText={name.setValue}
        error={name.error}
        maxLength={140}
        autoFocus
        onSubmitEditing={submit}
        testID="review-name-input"
      />
      <Field
        label="Summary (optional)"
        placeholder="What must this Review decide, and by when?"
        value={summary.value}
        onChangeText={summary.setValue}
        error={summary.error}
        multiline
        numberOfLines={3}
        testID="review-summary-input"
      />
      <FormError message={formError} testID="create-review-error" />
      <View style={styles.actions}>
        <Button label="Cancel" variant="quiet" onPress={onDone} testID="create-review-cancel" />
        <Button label="Create review" busy={create.isPending} onPress={submit} testID="create-review-button" />
      </View>
    </Card>
  );
}

const styles = StyleSheet.create({
  card: { gap: space[2] },
  actions: { flexDirection: 'row', justifyContent: 'flex-end', gap: space[1] },
});
