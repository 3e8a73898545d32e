import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { StyleSheet, View } from 'react-native';
import { z } from 'zod';

import { usePutDesignBasisMutation } from '@/components/data/board';
import { Button } from '@/components/ui/button';
import { FormError, FormField } from '@/components/ui/field';
import { space } from '@/components/ui/tokens';
import { setServerErrors } from '@/components/ui/use-field';
import { firedHoursPerYearSchema, type DesignBasis } from '@/server/contracts/board';

/** The text typed, read as the number the basis takes, with the basis's own messages. */
const firedHoursForm = z.object({
  firedHoursPerYear: z
    .string()
    .trim()
    .min(1, { error: 'Fired hours per year is required.' })
    .transform((text) => Number(text))
    .pipe(firedHoursPerYearSchema),
});

/**
 * Fired hours per year of the design basis (Lead, Owner): checked as you type with the basis
 * schema; saving puts the whole basis back with the new hours (every year then recomputes).
 */
export function FiredHoursForm({ reviewId, basis }: { reviewId: string; basis: DesignBasis }) {
  const put = usePutDesignBasisMutation(reviewId);
  const { control, handleSubmit, setError, formState } = useForm({
    resolver: zodResolver(firedHoursForm),
    mode: 'onChange',
    defaultValues: { firedHoursPerYear: String(basis.firedHoursPerYear ?? 6000) },
  });
  const submit = handleSubmit(async ({ firedHoursPerYear }) => {
    const { revision: _revision, updatedAt: _updatedAt, ...rest } = basis;
    try {
      await put.mutateAsync({ ...rest, firedHoursPerYear });
    } catch (error) {
      setServerErrors(error, setError, ['firedHoursPerYear']);
    }
  });
  const saving = formState.isSubmitting;
  return (
    <View style={styles.row}>
      <View style={styles.field}>
        <FormField
          control={control}
          name="firedHoursPerYear"
          label="Fired hours per year (h)"
          hint="A peaking unit runs a few hundred hours, a base-load plant most of the 8760."
          inputMode="numeric"
          onSubmitEditing={() => !saving && void submit()}
          testID="site-year-fired-hours-input"
        />
      </View>
      <Button
        label="Save hours"
        variant="secondary"
        busy={saving}
        disabled={!formState.isDirty}
        onPress={() => !saving && void submit()}
        testID="site-year-fired-hours-save"
      />
      <FormError message={formState.errors.root?.server?.message} testID="site-year-fired-hours-form-error" />
    </View>
  );
}

const styles = StyleSheet.create({
  row: { flexDirection: 'row', flexWrap: 'wrap', alignItems: 'flex-end', gap: space[1] },
  field: { flexBasis: 220, flexGrow: 1, flexShrink: 1, minWidth: 0, maxWidth: 360 },
});
