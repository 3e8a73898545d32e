import { forwardRef, useState } from 'react';
import { Controller, type Control, type FieldPathByValue, type FieldValues } from 'react-hook-form';
import { Pressable, StyleSheet, TextInput, View, type TextInputProps } from 'react-native';

import { focusRing, type PressState } from './focus';
import { Text } from './text';
import { useTheme } from './theme';
import { fontFamily, radius, space, touchTarget, typeScale } from './tokens';

export type FieldProps = Omit<TextInputProps, 'style'> & {
  label: string;
  error?: string | null;
  hint?: string;
  testID: string;
};

/** A labelled text input with its error (named for the field) right below it. */
export const Field = forwardRef<TextInput, FieldProps>(function Field(
  { label, error, hint, testID, multiline, ...rest },
  ref,
) {
  const t = useTheme();
  const [focused, setFocused] = useState(false);
  const border = error ? t.danger : focused ? t.focus : t.hairline;
  return (
    <View style={styles.wrap}>
      <Text size="small" weight="medium" tone="soft" nativeID={`${testID}-label`}>
        {label}
      </Text>
      <TextInput
        ref={ref}
        testID={testID}
        accessibilityLabel={label}
        aria-invalid={!!error}
        placeholderTextColor={t.textMuted}
        multiline={multiline}
        {...rest}
        onFocus={(e) => {
          setFocused(true);
          rest.onFocus?.(e);
        }}
        onBlur={(e) => {
          setFocused(false);
          rest.onBlur?.(e);
        }}
        style={[
          styles.input,
          multiline && styles.multiline,
          { borderColor: border, color: t.text, backgroundColor: t.surfaceRaised },
          focused && { outlineColor: t.focus, outlineWidth: 1, outlineStyle: 'solid' },
        ]}
      />
      {error ? (
        <Text size="small" tone="danger" testID={`${testID}-error`} role="alert">
          {error}
        </Text>
      ) : hint ? (
        <Text size="small" tone="muted">
          {hint}
        </Text>
      ) : null}
    </View>
  );
});

export type FormFieldProps<
  TValues extends FieldValues,
  TName extends FieldPathByValue<TValues, string | undefined>,
  TContext,
  TOutput,
> = Omit<FieldProps, 'value' | 'onChangeText' | 'error'> & {
  /** The form's `control` from `useForm`. */
  control: Control<TValues, TContext, TOutput>;
  /** A text field of the form's values. */
  name: TName;
};

/**
 * A `Field` bound to one text value of a react-hook-form form through `Controller` (no DOM
 * refs, so it works on native and on the web alike). The message shown is the field's
 * error: the schema's as you type, or the server's set with `setError` / `setServerErrors`.
 */
export function FormField<
  TValues extends FieldValues,
  TName extends FieldPathByValue<TValues, string | undefined>,
  TContext,
  TOutput,
>({ control, name, onBlur, ...field }: FormFieldProps<TValues, TName, TContext, TOutput>) {
  return (
    <Controller
      control={control}
      name={name}
      render={({ field: bound, fieldState }) => (
        <Field
          {...field}
          ref={bound.ref}
          value={(bound.value as string | undefined) ?? ''}
          onChangeText={bound.onChange}
          onBlur={(e) => {
            bound.onBlur();
            onBlur?.(e);
          }}
          error={fieldState.error?.message}
        />
      )}
    />
  );
}

export type ChoiceOption<V extends string> = { value: V; label: string };

/** A row of mutually exclusive options (radio semantics), each a full 44 px target. */
export function Choice<V extends string>({
  label,
  options,
  value,
  onChange,
  testID,
  error,
}: {
  label: string;
  options: ReadonlyArray<ChoiceOption<V>>;
  value: V;
  onChange: (value: V) => void;
  testID: string;
  error?: string | null;
}) {
  const t = useTheme();
  return (
    <View style={styles.wrap} role="radiogroup" accessibilityLabel={label} testID={testID}>
      <Text size="small" weight="medium" tone="soft">
        {label}
      </Text>
      <View style={styles.choices}>
        {options.map((o) => {
          const selected = o.value === value;
          return (
            <Pressable
              key={o.value}
              role="radio"
              accessibilityLabel={`${label}: ${o.label}`}
              accessibilityState={{ checked: selected, selected }}
              aria-checked={selected}
              testID={`${testID}-${o.value}`}
              onPress={() => onChange(o.value)}
              style={({ focused }: PressState) => [
                styles.choice,
                {
                  borderColor: selected ? t.accent : t.hairline,
                  backgroundColor: selected ? t.accent : t.surfaceRaised,
                },
                focused && focusRing(t),
              ]}
            >
              <Text size="small" weight="medium" style={{ color: selected ? t.onAccent : t.text }}>
                {o.label}
              </Text>
            </Pressable>
          );
        })}
      </View>
      {error ? (
        <Text size="small" tone="danger" role="alert">
          {error}
        </Text>
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  wrap: { gap: space.half + 2, width: '100%' },
  input: {
    minHeight: touchTarget,
    borderWidth: 1,
    borderRadius: radius.control,
    paddingHorizontal: space[1] + space.half,
    paddingVertical: space[1] + 2,
    fontFamily: fontFamily.sans,
    ...typeScale.body,
  },
  multiline: { minHeight: touchTarget * 2, textAlignVertical: 'top' },
  choices: { flexDirection: 'row', flexWrap: 'wrap', gap: space[1] },
  choice: {
    minHeight: touchTarget,
    minWidth: touchTarget,
    paddingHorizontal: space[2],
    borderRadius: radius.control,
    borderWidth: 1,
    alignItems: 'center',
    justifyContent: 'center',
  },
});

/** Input settings every e-mail field shares: the right keyboard, no capitals, autofill. */
export const emailInput = {
  keyboardType: 'email-address',
  inputMode: 'email',
  autoCapitalize: 'none',
  autoComplete: 'email',
} as const satisfies Partial<TextInputProps>;

/** A form-level error under the fields (field errors sit at their field). */
export function FormError({ message, testID }: { message: string | null | undefined; testID: string }) {
  if (!message) return null;
  return (
    <Text size="small" tone="danger" role="alert" testID={testID}>
      {message}
    </Text>
  );
}
