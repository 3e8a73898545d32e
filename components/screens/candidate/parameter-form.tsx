import type { ReactNode } from 'react';
import { Controller, type FieldPath } from 'react-hook-form';
import { StyleSheet, View } from 'react-native';

import { Badge } from '@/components/ui/badge';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { Choice, Field, FormError } from '@/components/ui/field';
import type { UnitSystem } from '@/components/ui/format';
import { Heading, Text } from '@/components/ui/text';
import { useTheme } from '@/components/ui/theme';
import { space } from '@/components/ui/tokens';

import { fieldSpecs, labelOf, textAt, type FieldSpec, type ParameterFormValues } from './parameter-model';
import { unitOf } from './quantities';
import type { ParameterDraft } from './use-parameter-draft';

const stageOptions = [1, 2, 3, 4].map((n) => ({ value: String(n), label: String(n) }));
const regeneratorOptions = [
  { value: 'off', label: 'None' },
  { value: 'on', label: 'Regenerator' },
] as const;

const testIdOf = (name: string) => `param-${name.replace('.', '-')}`;

function labelWithUnit(spec: FieldSpec, system: UnitSystem) {
  const unit = unitOf(spec.kind, system);
  return unit === '–' ? spec.label : `${spec.label} (${unit})`;
}

/**
 * The cycle's parameters: compressor, regenerator, combustor, turbine. Each field is checked
 * with the server's schema as you type; the engine's refusal of the combination (the
 * preview's, or the one stored on the candidate) shows at the field it names. Changes are
 * applied for everyone with Save (or Enter in a field); until then they are a preview.
 */
export function ParameterForm({
  draft,
  system,
  canEdit,
}: {
  draft: ParameterDraft;
  system: UnitSystem;
  canEdit: boolean;
}) {
  const t = useTheme();
  const { form, values } = draft;
  const submit = () => {
    if (!draft.saving) void draft.save();
  };

  const field = (spec: FieldSpec) => {
    if (spec.when && !spec.when(values)) return null;
    return (
      <Controller
        key={spec.name}
        control={form.control}
        name={spec.name as FieldPath<ParameterFormValues>}
        render={({ field: bound, fieldState }) => (
          <Field
            ref={bound.ref}
            label={labelWithUnit(spec, system)}
            value={(bound.value as string) ?? ''}
            onChangeText={bound.onChange}
            onBlur={bound.onBlur}
            error={fieldState.error?.message ?? draft.engineErrorAt(spec.name)}
            hint={spec.hint(system)}
            editable={canEdit}
            inputMode="decimal"
            keyboardType="decimal-pad"
            onSubmitEditing={submit}
            testID={testIdOf(spec.name)}
          />
        )}
      />
    );
  };

  const stages = (name: 'compressor.stages' | 'turbine.stages', label: string) => (
    <Controller
      control={form.control}
      name={name}
      render={({ field: bound, fieldState }) =>
        canEdit ? (
          <Choice
            label={`${label} (stages)`}
            options={stageOptions}
            value={bound.value}
            onChange={bound.onChange}
            error={fieldState.error?.message ?? draft.engineErrorAt(name)}
            testID={testIdOf(name)}
          />
        ) : (
          <ReadOnlyLine label={label} value={`${bound.value} ${bound.value === '1' ? 'stage' : 'stages'}`} />
        )
      }
    />
  );

  const group = (names: string[]) => fieldSpecs.filter((s) => names.includes(s.name)).map(field);

  return (
    <Card style={styles.card} testID="parameter-form">
      <View style={styles.titleRow}>
        <Heading level={2}>Parameters</Heading>
        {draft.dirty ? <Badge label="Unsaved changes" tone="warning" testID="parameters-unsaved" /> : null}
      </View>
      <Text size="small" tone="soft">
        {canEdit
          ? 'Figures marked Preview follow your typing and are not saved. Save (or Enter in a field) applies the changes for everyone.'
          : 'Read only: your role does not change candidates.'}
      </Text>

      <Section title="Compressor">
        {stages('compressor.stages', 'Compressor')}
        {group([
          'compressor.pressureRatio',
          'compressor.isentropicEfficiency',
          'compressor.intercoolTemperatureK',
          'compressor.intercoolerPressureLoss',
        ])}
      </Section>

      <Section title="Regenerator">
        <Controller
          control={form.control}
          name="regeneratorOn"
          render={({ field: bound }) =>
            canEdit ? (
              <Choice
                label="Regenerator"
                options={regeneratorOptions}
                value={bound.value ? 'on' : 'off'}
                onChange={(v) => bound.onChange(v === 'on')}
                testID="param-regenerator"
              />
            ) : (
              <ReadOnlyLine label="Regenerator" value={bound.value ? 'Fitted' : 'None'} />
            )
          }
        />
        {group(['regenerator.effectiveness', 'regenerator.airSidePressureLoss', 'regenerator.gasSidePressureLoss'])}
      </Section>

      <Section title="Combustor">{group(['combustorPressureLoss'])}</Section>

      <Section title="Turbine">
        {stages('turbine.stages', 'Turbine')}
        {group([
          'turbine.inletTemperatureK',
          'turbine.isentropicEfficiency',
          'turbine.reheatTemperatureK',
          'turbine.reheaterPressureLoss',
        ])}
      </Section>

      {draft.conflict ? (
        <View
          style={[styles.conflict, { borderColor: t.warning }]}
          role="alert"
          testID="parameters-conflict"
          accessibilityLabel="Changed by someone else meanwhile"
        >
          <Text weight="semibold" testID="parameters-conflict-title">
            Changed by {draft.conflict.theirs.updatedBy?.name ?? 'someone else'} meanwhile
          </Text>
          <Text size="small" tone="soft">
            Your changes are not saved. Now on the candidate, against yours:
          </Text>
          {draft.conflict.names.map((name) => {
            const theirs = draftTexts(draft, name);
            return (
              <Text size="small" key={name} testID={`conflict-${name}`}>
                {labelOf(name)}:{' '}
                <Text size="small" mono>
                  {theirs.theirs || '—'}
                </Text>{' '}
                now, yours{' '}
                <Text size="small" mono>
                  {theirs.mine || '—'}
                </Text>
              </Text>
            );
          })}
          <View style={styles.actions}>
            <Button label="Take theirs" variant="secondary" onPress={draft.takeTheirs} testID="conflict-take-theirs" />
            <Button
              label="Apply mine again"
              busy={draft.saving}
              onPress={() => void draft.applyMine()}
              testID="conflict-apply-mine"
            />
          </View>
        </View>
      ) : null}

      <FormError message={draft.saveError} testID="parameters-save-error" />
      {draft.preview.other ? <FormError message={draft.preview.other} testID="preview-error" /> : null}

      {canEdit ? (
        <View style={styles.actions}>
          <Button
            label="Discard"
            variant="quiet"
            disabled={!draft.dirty || draft.saving}
            onPress={draft.discard}
            testID="parameters-discard"
          />
          <Button
            label="Save for everyone"
            busy={draft.saving}
            disabled={!draft.dirty}
            onPress={submit}
            testID="parameters-save"
          />
        </View>
      ) : null}
    </Card>
  );
}

function draftTexts(draft: ParameterDraft, name: string) {
  const conflict = draft.conflict!;
  return { mine: textAt(conflict.mine, name), theirs: textAt(draft.theirsValues(conflict.theirs), name) };
}

function Section({ title, children }: { title: string; children: ReactNode }) {
  return (
    <View style={styles.section} role="group" accessibilityLabel={title}>
      <Heading level={3}>{title}</Heading>
      {children}
    </View>
  );
}

function ReadOnlyLine({ label, value }: { label: string; value: string }) {
  return (
    <View style={styles.readOnly}>
      <Text size="small" weight="medium" tone="soft">
        {label}
      </Text>
      <Text>{value}</Text>
    </View>
  );
}

const styles = StyleSheet.create({
  card: { gap: space[2] },
  titleRow: { flexDirection: 'row', alignItems: 'center', gap: space[1], flexWrap: 'wrap' },
  section: { gap: space[2], paddingTop: space[1] },
  actions: { flexDirection: 'row', justifyContent: 'flex-end', gap: space[1], flexWrap: 'wrap' },
  conflict: { borderWidth: 1, borderRadius: 8, padding: space[2], gap: space[1] },
  readOnly: { gap: space.half },
});
