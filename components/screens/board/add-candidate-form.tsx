import { zodResolver } from '@hookform/resolvers/zod';
import { Controller, useForm, useWatch } from 'react-hook-form';
import { StyleSheet, View } from 'react-native';
import { z } from 'zod';

import { useCreateCandidateMutation } from '@/components/data/board';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { Choice, FormError, FormField } from '@/components/ui/field';
import { useMessage } from '@/components/ui/message';
import { Heading, Text } from '@/components/ui/text';
import { space } from '@/components/ui/tokens';
import { setServerErrors } from '@/components/ui/use-field';
import {
  candidateName,
  candidatePresets,
  presetLabels,
  type CandidateWire,
  type CreateCandidateInput,
} from '@/server/contracts/board';

/** The form's values; they become the route's `{ name, preset }` or `{ name, copyOf }`. */
const addCandidateForm = z
  .object({
    name: candidateName,
    source: z.enum(['preset', 'copy']),
    preset: z.enum(candidatePresets, { error: 'Choose a preset.' }),
    copyOf: z.string(),
  })
  .superRefine((v, ctx) => {
    if (v.source === 'copy' && !v.copyOf)
      ctx.addIssue({ code: 'custom', path: ['copyOf'], message: 'Choose the candidate to copy.' });
  });

/** A new candidate from one of the five presets or as a copy of another, with its name. */
export function AddCandidateForm({
  reviewId,
  candidates,
  onDone,
}: {
  reviewId: string;
  candidates: CandidateWire[];
  onDone: (candidate: CandidateWire | null) => void;
}) {
  const create = useCreateCandidateMutation(reviewId);
  const message = useMessage();
  const { control, handleSubmit, setError, formState } = useForm({
    resolver: zodResolver(addCandidateForm),
    mode: 'onChange',
    defaultValues: {
      name: '',
      source: 'preset',
      preset: 'simple',
      copyOf: candidates[0]?.id ?? '',
    } as z.input<typeof addCandidateForm>,
  });
  const source = useWatch({ control, name: 'source' });

  const submit = handleSubmit(async (v) => {
    const input: CreateCandidateInput =
      v.source === 'preset' ? { name: v.name, preset: v.preset } : { name: v.name, copyOf: v.copyOf };
    try {
      const candidate = await create.mutateAsync(input);
      message.show(`Candidate “${candidate.name}” added.`);
      onDone(candidate);
    } catch (error) {
      setServerErrors(error, setError, ['name', 'preset', 'copyOf']);
    }
  });
  const saving = formState.isSubmitting;
  const submitOnce = () => {
    if (!saving) void submit();
  };

  return (
    <Card style={styles.card} testID="add-candidate-form">
      <Heading level={2}>Add a candidate</Heading>
      <Text size="small" tone="soft">
        Start from a preset with common-practice values, or copy a candidate and change it. The server computes it with
        this Review’s design basis.
      </Text>
      <FormField
        control={control}
        name="name"
        label="Candidate name"
        placeholder="e.g. Recuperated, low pressure ratio"
        maxLength={100}
        autoFocus
        onSubmitEditing={submitOnce}
        testID="candidate-name-input"
      />
      {candidates.length > 0 ? (
        <Controller
          control={control}
          name="source"
          render={({ field }) => (
            <Choice
              label="Start from"
              value={field.value}
              onChange={field.onChange}
              options={[
                { value: 'preset', label: 'A preset' },
                { value: 'copy', label: 'A copy of a candidate' },
              ]}
              testID="candidate-source"
            />
          )}
        />
      ) : null}
      {source === 'preset' ? (
        <Controller
          control={control}
          name="preset"
          render={({ field, fieldState }) => (
            <Choice
              label="Preset"
              value={field.value}
              onChange={field.onChange}
              options={candidatePresets.map((p) => ({ value: p, label: presetLabels[p] }))}
              error={fieldState.error?.message}
              testID="candidate-preset"
            />
          )}
        />
      ) : (
        <Controller
          control={control}
          name="copyOf"
          render={({ field, fieldState }) => (
            <Choice
              label="Copy of"
              value={field.value}
              onChange={field.onChange}
              options={candidates.map((c) => ({ value: c.id, label: c.name }))}
              error={fieldState.error?.message}
              testID="candidate-copy-of"
            />
          )}
        />
      )}
      <FormError message={formState.errors.root?.server?.message} testID="add-candidate-error" />
      <View style={styles.actions}>
        <Button label="Cancel" variant="quiet" onPress={() => onDone(null)} testID="add-candidate-cancel" />
        <Button label="Add candidate" busy={saving} onPress={submitOnce} testID="add-candidate-button" />
      </View>
    </Card>
  );
}

const styles = StyleSheet.create({
  card: { gap: space[2] },
  actions: { flexDirection: 'row', justifyContent: 'flex-end', gap: space[1] },
});
