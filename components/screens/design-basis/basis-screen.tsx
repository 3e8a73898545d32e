import { zodResolver } from '@hookform/resolvers/zod';
import { useEffect, useMemo, useState } from 'react';
import { Controller, useFieldArray, useForm, useWatch, type FieldPath } from 'react-hook-form';
import { StyleSheet, View } from 'react-native';

import { isApiError } from '@/components/data/api-error';
import { useBoardQuery, usePutDesignBasisMutation, useReviewLiveUpdates } from '@/components/data/board';
import { unitOf, type QuantityKind } from '@/components/screens/candidate/quantities';
import { BackLink } from '@/components/ui/back-link';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { CautionLine } from '@/components/ui/caution-line';
import { Choice, Field, FormError } from '@/components/ui/field';
import { formatNumber, type UnitSystem } from '@/components/ui/format';
import { messageFor } from '@/components/ui/message-for';
import { Screen } from '@/components/ui/screen';
import { ErrorState, LoadingState } from '@/components/ui/states';
import { Heading, Text } from '@/components/ui/text';
import { space } from '@/components/ui/tokens';
import { useUnitSystem } from '@/components/ui/unit-system';
import type { Board } from '@/server/contracts/board';
import { roleAllows } from '@/server/contracts/roles';

import { basisFormSchema, fluidExplained, toBasisForm, weightShares, type BasisFormValues } from './basis-model';

/** The Design basis of a review: Lead and Owner edit, everyone reads. */
export function BasisScreen({ reviewId }: { reviewId: string }) {
  const board = useBoardQuery(reviewId);
  useReviewLiveUpdates(reviewId);
  const back = (
    <BackLink
      href={`/reviews/${encodeURIComponent(reviewId)}`}
      to="Board"
      label="Back to the board"
      testID="back-to-board"
    />
  );
  if (board.error)
    return (
      <Screen title="Design basis" testID="basis-screen">
        {back}
        <ErrorState error={board.error} onRetry={() => void board.refetch()} />
      </Screen>
    );
  if (!board.data)
    return (
      <Screen title="Design basis" testID="basis-screen">
        <LoadingState label="Loading the design basis…" />
      </Screen>
    );
  return (
    <Screen
      title="Design basis"
      eyebrow={`Review · ${board.data.review.name}`}
      testID="basis-screen"
      footer={<CautionLine />}
    >
      {back}
      <BasisForm reviewId={reviewId} board={board.data} />
    </Screen>
  );
}

function BasisForm({ reviewId, board }: { reviewId: string; board: Board }) {
  const { system } = useUnitSystem();
  const canEdit = roleAllows(board.myRole, { basis: ['update'] });
  const put = usePutDesignBasisMutation(reviewId);
  const schema = useMemo(() => basisFormSchema(system), [system]);
  const saved = useMemo(() => toBasisForm(board.designBasis, system), [board.designBasis, system]);
  const { control, handleSubmit, setError, reset, formState, getValues } = useForm<BasisFormValues, unknown, unknown>({
    resolver: zodResolver(schema) as never,
    mode: 'onChange',
    defaultValues: saved,
  });
  const criteria = useFieldArray({ control, name: 'criteria' });
  const values = useWatch({ control }) as BasisFormValues;
  const [done, setDone] = useState<string | null>(null);
  const [formError, setFormError] = useState<string | null>(null);

  // Someone else's save arrives through the cache: a clean form takes it.
  useEffect(() => {
    if (!formState.isDirty) reset(saved);
  }, [saved, reset, formState.isDirty]);

  const submit = handleSubmit(async (input) => {
    setDone(null);
    setFormError(null);
    try {
      const answer = await put.mutateAsync(input as never);
      const n = answer.candidates.length;
      setDone(`Saved. ${n} ${n === 1 ? 'candidate' : 'candidates'} recomputed.`);
      reset(toBasisForm(answer.designBasis, system));
    } catch (error) {
      const names = isApiError(error) ? [...Object.keys(error.fieldErrors), ...(error.field ? [error.field] : [])] : [];
      const known = names.filter((n) => getValues(n as FieldPath<BasisFormValues>) !== undefined);
      for (const n of known)
        setError(n as FieldPath<BasisFormValues>, {
          type: 'server',
          message: (isApiError(error) && error.fieldError(n)) || messageFor(error),
        });
      if (known.length === 0) setFormError(messageFor(error));
    }
  });
  const submitOnce = () => {
    if (!formState.isSubmitting) void submit();
  };

  const text = (name: FieldPath<BasisFormValues>, label: string, kind: QuantityKind | 'MW', hint?: string) => (
    <Controller
      key={name}
      control={control}
      name={name}
      render={({ field, fieldState }) => {
        const unit = kind === 'MW' ? 'MW' : unitOf(kind, system);
        return (
          <Field
            ref={field.ref}
            label={unit === '–' ? label : `${label} (${unit})`}
            value={(field.value as string) ?? ''}
            onChangeText={field.onChange}
            onBlur={field.onBlur}
            error={fieldState.error?.message}
            hint={hint}
            editable={canEdit}
            inputMode="decimal"
            onSubmitEditing={submitOnce}
            testID={`basis-${name.replace(/\./g, '-')}`}
          />
        );
      }}
    />
  );
  const shares = weightShares((values.criteria ?? []).map((c) => c?.weight ?? ''));

  return (
    <View style={styles.gap2}>
      {!canEdit ? (
        <Text size="small" tone="soft" testID="basis-read-only">
          Read only: the Lead and the Owner set the design basis.
        </Text>
      ) : null}
      <Card style={styles.gap2}>
        <Heading level={2}>Site</Heading>
        {text('ambient.temperatureK', 'Ambient temperature', 'temperature', ratingHint(system))}
        <Controller
          control={control}
          name="siteBy"
          render={({ field }) => (
            <Choice
              label="Site given by"
              options={[
                { value: 'elevation', label: 'Elevation' },
                { value: 'pressure', label: 'Pressure' },
              ]}
              value={field.value}
              onChange={canEdit ? field.onChange : () => {}}
              testID="basis-site-by"
            />
          )}
        />
        {values.siteBy === 'pressure'
          ? text('ambient.pressureKPa', 'Ambient pressure', 'pressure')
          : text('ambient.elevationM', 'Elevation', 'elevation', 'Pressure from the standard atmosphere (ISA).')}
        {text('ambient.relativeHumidity', 'Relative humidity', 'percent')}
      </Card>
      <Card style={styles.gap2}>
        <Heading level={2}>Fuel and power</Heading>
        {text(
          'fuel.hydrogenVolumeFraction',
          'Hydrogen in the methane–hydrogen blend (by volume)',
          'percent',
          '0 % is natural gas taken as methane.',
        )}
        {text('fuel.temperatureK', 'Fuel temperature', 'temperature')}
        {text('netPowerKW', 'Required net power', 'MW')}
        {text(
          'generatorEfficiency',
          'Generator efficiency',
          'fraction',
          'Common practice: 0.98–0.99; a warning below 0.95.',
        )}
        <Controller
          control={control}
          name="fluid"
          render={({ field }) => (
            <View style={styles.gap1}>
              <Choice
                label="Property model"
                options={Object.entries(fluidExplained).map(([value, f]) => ({
                  value: value as BasisFormValues['fluid'],
                  label: f.label,
                }))}
                value={field.value}
                onChange={canEdit ? field.onChange : () => {}}
                testID="basis-fluid"
              />
              {Object.values(fluidExplained).map((f) => (
                <Text key={f.label} size="small" tone="soft">
                  {f.label}: {f.line}
                </Text>
              ))}
            </View>
          )}
        />
      </Card>
      <Card style={styles.gap2}>
        <Heading level={2}>Limits</Heading>
        {text(
          'limits.maxTurbineInletTemperatureK',
          'Highest turbine inlet temperature',
          'temperature',
          'Blank: no limit. A candidate above it carries a warning.',
        )}
        {text('limits.exhaustTemperatureMinK', 'Lowest exhaust temperature', 'temperature', 'Blank: no lower end.')}
        {text('limits.exhaustTemperatureMaxK', 'Highest exhaust temperature', 'temperature', 'Blank: no upper end.')}
      </Card>
      <Card style={styles.gap2} testID="basis-criteria">
        <Heading level={2}>Evaluation criteria</Heading>
        {criteria.fields.map((c, i) => (
          <View key={c.id} style={styles.criterion} testID={`criterion-${i}`}>
            <View style={styles.criterionName}>{text(`criteria.${i}.name`, 'Criterion', 'ratio')}</View>
            <View style={styles.criterionWeight}>{text(`criteria.${i}.weight`, 'Weight', 'ratio')}</View>
            <Text size="small" mono style={styles.share} testID={`criterion-${i}-share`}>
              {formatNumber(shares[i] ?? 0, 3)} %
            </Text>
            {canEdit ? (
              <Button
                label="Remove"
                accessibilityLabel={`Remove criterion ${i + 1}`}
                variant="quiet"
                small
                onPress={() => criteria.remove(i)}
                testID={`criterion-${i}-remove`}
              />
            ) : null}
          </View>
        ))}
        <FormError
          message={formState.errors.criteria?.message ?? formState.errors.criteria?.root?.message}
          testID="criteria-error"
        />
        {canEdit ? (
          <Button
            label="Add a criterion"
            variant="secondary"
            onPress={() => criteria.append({ name: '', weight: '1', measure: null })}
            testID="criterion-add"
          />
        ) : null}
      </Card>
      <FormError message={formError} testID="basis-error" />
      {done ? (
        <Text tone="good" role="status" testID="basis-saved">
          {done}
        </Text>
      ) : null}
      {canEdit ? (
        <View style={styles.actions}>
          <Button
            label="Discard"
            variant="quiet"
            disabled={!formState.isDirty}
            onPress={() => reset(saved)}
            testID="basis-discard"
          />
          <Button
            label="Save the design basis"
            busy={formState.isSubmitting}
            onPress={submitOnce}
            testID="basis-save"
          />
        </View>
      ) : null}
    </View>
  );
}

function ratingHint(system: UnitSystem) {
  return system === 'si'
    ? 'ISO rating conditions: 288.15 K (15 °C), 101.325 kPa, 60 % RH.'
    : 'ISO rating conditions: 59 °F, 14.7 psia, 60 % RH.';
}

const styles = StyleSheet.create({
  gap1: { gap: space[1] },
  gap2: { gap: space[2] },
  criterion: { flexDirection: 'row', flexWrap: 'wrap', alignItems: 'flex-end', gap: space[1] },
  criterionName: { flexGrow: 2, flexBasis: 180 },
  criterionWeight: { flexGrow: 1, flexBasis: 80 },
  share: { minWidth: 64, paddingBottom: space[1] + 4 },
  actions: { flexDirection: 'row', justifyContent: 'flex-end', gap: space[1] },
});
