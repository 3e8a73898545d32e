import { useQueryClient } from '@tanstack/react-query';
import { useRef, useState } from 'react';
import { StyleSheet, View, type TextInput } from 'react-native';

import { authCall, credentialFields } from '@/components/auth/auth-call';
import { authClient } from '@/components/auth/auth-client';
import { emailField, passwordField, personName } from '@/components/auth/credentials';
import { Button } from '@/components/ui/button';
import { emailInput, Field, FormError } from '@/components/ui/field';
import { Text } from '@/components/ui/text';
import { space } from '@/components/ui/tokens';
import { showFieldErrors, useField } from '@/components/ui/use-field';

/** Name, e-mail, password (at least 10 characters), each checked as you type. */
export function SignUpForm({
  initialEmail = '',
  onSignedUp,
}: {
  initialEmail?: string;
  onSignedUp: () => void | Promise<void>;
}) {
  const qc = useQueryClient();
  const name = useField(personName);
  const email = useField(emailField, initialEmail);
  const password = useField(passwordField);
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const emailRef = useRef<TextInput>(null);
  const passwordRef = useRef<TextInput>(null);

  const submit = async () => {
    const ok = [name.validate(), email.validate(), password.validate()].every(Boolean);
    if (!ok || busy) return;
    setBusy(true);
    setError(null);
    try {
      await authCall(
        authClient.signUp.email({
          name: name.value.trim(),
          email: email.value.trim().toLowerCase(),
          password: password.value,
        }),
        credentialFields,
      );
      qc.clear();
      await onSignedUp();
    } catch (e) {
      setError(showFieldErrors(e, { name, email, password }));
    } finally {
      setBusy(false);
    }
  };

  return (
    <View style={styles.form}>
      <Field
        label="Your name"
        value={name.value}
        onChangeText={name.setValue}
        error={name.error}
        autoComplete="name"
        returnKeyType="next"
        onSubmitEditing={() => emailRef.current?.focus()}
        testID="sign-up-name"
      />
      <Field
        ref={emailRef}
        label="E-mail"
        value={email.value}
        onChangeText={email.setValue}
        error={email.error}
        {...emailInput}
        returnKeyType="next"
        onSubmitEditing={() => passwordRef.current?.focus()}
        testID="sign-up-email"
      />
      <Field
        ref={passwordRef}
        label="Password"
        hint="At least 10 characters."
        value={password.value}
        onChangeText={password.setValue}
        error={password.error}
        secureTextEntry
        autoComplete="new-password"
        returnKeyType="go"
        onSubmitEditing={() => void submit()}
        testID="sign-up-password"
      />
      <FormError message={error} testID="sign-up-error" />
      <Button label="Create account" busy={busy} onPress={() => void submit()} testID="sign-up-button" />
    </View>
  );
}

const styles = StyleSheet.create({ form: { gap: space[2] } });
