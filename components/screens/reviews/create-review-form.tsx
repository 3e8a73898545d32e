import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { StyleSheet, View } from 'react-native';

import { useCreateReviewMutation } from '@/components/data/reviews';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { FormError, FormField } from '@/components/ui/field';
import { useMessage } from '@/components/ui/message';
import { Heading, Text } from '@/components/ui/text';
import { space } from '@/components/ui/tokens';
import { setServerErrors } from '@/components/ui/use-field';
import { createReviewInput, type CreateReviewInput } from '@/server/contracts/review';

/** Name and summary, checked with the server's own schema as you type; a taken name shows at the name. */
export function CreateReviewForm({ teamId, onDone }: { teamId: string; onDone: () => void }) {
  const create = useCreateReviewMutation(teamId);
  const message = useMessage();
  const { control, handleSubmit, setError, formState } = useForm({
    resolver: zodResolver(createReviewInput),
    // Each field is checked from its first change on, and again on submit.
    mode: 'onChange',
    defaultValues: { name: '', summary: '' } satisfies CreateReviewInput,
  });

  // The schema trims: the server receives what it would store.
  const submit = handleSubmit(async (input) => {
    try {
      const review = await create.mutateAsync(input);
      message.show(`Review “${review.name}” created.`);
      onDone();
    } catch (error) {
      setServerErrors(error, setError, ['name', 'summary']);
    }
  });
  const saving = formState.isSubmitting;
  const submitOnce = () => {
    if (!saving) void submit();
  };

  return (
    <Card style={styles.card} testID="create-review-form">
      <Heading level={2}>New review</Heading>
      <Text size="small" tone="soft">
        One Review is one concept-selection effort: its Design basis, its Candidates and the Decision record.
      </Text>
      <FormField
        control={control}
        name="name"
        label="Review name"
        placeholder="e.g. Unit 3 peaking — cycle choice"
        maxLength={140}
        autoFocus
        onSubmitEditing={submitOnce}
        testID="review-name-input"
      />
      <FormField
        control={control}
        name="summary"
        label="Summary (optional)"
        placeholder="What must this Review decide, and by when?"
        multiline
        numberOfLines={3}
        testID="review-summary-input"
      />
      <FormError message={formState.errors.root?.server?.message} testID="create-review-error" />
      <View style={styles.actions}>
        <Button label="Cancel" variant="quiet" onPress={onDone} testID="create-review-cancel" />
        <Button label="Create review" busy={saving} onPress={submitOnce} testID="create-review-button" />
      </View>
    </Card>
  );
}

const styles = StyleSheet.create({
  card: { gap: space[2] },
  actions: { flexDirection: 'row', justifyContent: 'flex-end', gap: space[1] },
});
