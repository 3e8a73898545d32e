import { useQueryClient } from '@tanstack/react-query';
import { useRef, useState } from 'react';
import { StyleSheet, View, type TextInput } from 'react-native';

import { authCall } from '@/components/auth/auth-call';
import { authClient } from '@/components/auth/auth-client';
import { confirmationLanding, emailField, signInPassword } from '@/components/auth/credentials';
import { isApiError } from '@/components/data/api-error';
import { Button } from '@/components/ui/button';
import { emailInput, Field, FormError } from '@/components/ui/field';
import { messageFor } from '@/components/ui/message-for';
import { space } from '@/components/ui/tokens';
import { useField } from '@/components/ui/use-field';

/** E-mail and password; a wrong pair is one message for the form (never saying which part was wrong). */
export function SignInForm({
  initialEmail = '',
  returnTo,
  onSignedIn,
}: {
  initialEmail?: string;
  /** Where a new confirmation link leads, when the address is not confirmed yet. */
  returnTo: string;
  onSignedIn: () => void | Promise<void>;
}) {
  const qc = useQueryClient();
  const email = useField(emailField, initialEmail);
  const password = useField(signInPassword);
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const passwordRef = useRef<TextInput>(null);

  const submit = async () => {
    const ok = [email.validate(), password.validate()].every(Boolean);
    if (!ok || busy) return;
    setBusy(true);
    setError(null);
    try {
      const address = email.value.trim().toLowerCase();
      try {
        await authCall(authClient.signIn.email({ email: address, password: password.value }));
      } catch (e) {
        // Right password, address not confirmed yet: a fresh link that leads back here.
        if (isApiError(e) && e.code === 'email_not_verified') {
          await authClient.sendVerificationEmail({ email: address, callbackURL: confirmationLanding(returnTo) });
        }
        throw e;
      }
      qc.clear();
      await onSignedIn();
    } catch (e) {
      setError(messageFor(e));
    } finally {
      setBusy(false);
    }
  };

  return (
    <View style={styles.form}>
      <Field
        label="E-mail"
        value={email.value}
        onChangeText={email.setValue}
        error={email.error}
        {...emailInput}
        returnKeyType="next"
        onSubmitEditing={() => passwordRef.current?.focus()}
        testID="sign-in-email"
      />
      <Field
        ref={passwordRef}
        label="Password"
        value={password.value}
        onChangeText={password.setValue}
        error={password.error}
        secureTextEntry
        autoComplete="current-password"
        returnKeyType="go"
        onSubmitEditing={() => void submit()}
        testID="sign-in-password"
      />
      <FormError message={error} testID="sign-in-error" />
      <Button label="Sign in" busy={busy} onPress={() => void submit()} testID="sign-in-button" />
    </View>
  );
}

const styles = StyleSheet.create({ form: { gap: space[2] } });
