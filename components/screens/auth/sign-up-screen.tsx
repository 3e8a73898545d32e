import { Redirect, useRouter } from 'expo-router';
import { StyleSheet, View } from 'react-native';

import { authClient } from '@/components/auth/auth-client';
import { safeNext } from '@/components/auth/credentials';
import { Text } from '@/components/ui/text';
import { space } from '@/components/ui/tokens';

import { AuthFrame } from './auth-frame';
import { SignUpForm } from './sign-up-form';
import { TextLink } from './text-link';

export function SignUpScreen({ next }: { next?: string }) {
  const router = useRouter();
  const session = authClient.useSession();
  const target = safeNext(next);
  if (session.data) return <Redirect href={target as never} />;
  const query = next ? `?next=${encodeURIComponent(target)}` : '';
  return (
    <AuthFrame
      title="Create your account"
      lead="Then start a Team, or accept an invitation from one."
      testID="sign-up-screen"
    >
      <SignUpForm onSignedUp={() => router.replace(target as never)} />
      <View style={styles.alt}>
        <Text tone="soft">Already have an account?</Text>
        <TextLink href={`/sign-in${query}` as never} label="Sign in" testID="to-sign-in" />
      </View>
    </AuthFrame>
  );
}

const styles = StyleSheet.create({
  alt: { flexDirection: 'row', alignItems: 'center', gap: space[1], flexWrap: 'wrap' },
});
