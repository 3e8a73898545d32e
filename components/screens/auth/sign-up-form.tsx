import { useRef, useState } from 'react';
import { StyleSheet, View, type TextInput } from 'react-native';

import { authCall, credentialFields } from '@/components/auth/auth-call';
import { authClient } from '@/components/auth/auth-client';
import { confirmationLanding, emailField, passwordField, personName } from '@/components/auth/credentials';
import { Button } from '@/components/ui/button';
import { emailInput, Field, FormError } from '@/components/ui/field';
import { messageFor } from '@/components/ui/message-for';
import { Text } from '@/components/ui/text';
import { space } from '@/components/ui/tokens';
import { showFieldErrors, useField } from '@/components/ui/use-field';

/**
 * Name, e-mail, password (at least 10 characters), each checked as you type. The account
 * is the address's once its owner opens the mailed link, which signs them in and leads
 * to `returnTo`; until then the form says where to look.
 */
export function SignUpForm({ initialEmail = '', returnTo }: { initialEmail?: string; returnTo: string }) {
  const [sentTo, setSentTo] = useState<string | null>(null);
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
      const address = email.value.trim().toLowerCase();
      await authCall(
        authClient.signUp.email({
          name: name.value.trim(),
          email: address,
          password: password.value,
          callbackURL: confirmationLanding(returnTo),
        }),
        credentialFields,
      );
      setSentTo(address);
    } catch (e) {
      setError(showFieldErrors(e, { name, email, password }));
    } finally {
      setBusy(false);
    }
  };

  if (sentTo) return <CheckInbox email={sentTo} returnTo={returnTo} onChangeAddress={() => setSentTo(null)} />;

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

/** After sign-up: where the link went, a way to send it again, a way back to fix the address. */
function CheckInbox({
  email,
  returnTo,
  onChangeAddress,
}: {
  email: string;
  returnTo: string;
  onChangeAddress: () => void;
}) {
  const [busy, setBusy] = useState(false);
  const [note, setNote] = useState<string | null>(null);
  const [error, setError] = useState<string | null>(null);

  const resend = async () => {
    setBusy(true);
    setError(null);
    setNote(null);
    try {
      await authCall(authClient.sendVerificationEmail({ email, callbackURL: confirmationLanding(returnTo) }));
      setNote('Sent again. It can take a minute to arrive; look in the spam folder too.');
    } catch (e) {
      setError(messageFor(e));
    } finally {
      setBusy(false);
    }
  };

  return (
    <View style={styles.form} testID="sign-up-check-inbox" accessibilityLiveRegion="polite">
      <Text weight="semibold">Check your inbox</Text>
      <Text tone="soft">
        We sent a link to <Text weight="semibold">{email}</Text>. Open it, on this device or another, to confirm the
        address is yours; it signs you in. The link works once and expires in a day.
      </Text>
      {note ? (
        <Text size="small" tone="soft" testID="sign-up-resent">
          {note}
        </Text>
      ) : null}
      <FormError message={error} testID="sign-up-resend-error" />
      <Button
        label="Send the link again"
        variant="secondary"
        busy={busy}
        onPress={() => void resend()}
        testID="sign-up-resend"
      />
      <Button label="Use another address" variant="quiet" onPress={onChangeAddress} testID="sign-up-change-address" />
    </View>
  );
}

const styles = StyleSheet.create({ form: { gap: space[2] } });
