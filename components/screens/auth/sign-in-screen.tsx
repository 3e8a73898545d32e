import { Redirect, useRouter } from 'expo-router';
import { StyleSheet, View } from 'react-native';

import { authClient } from '@/components/auth/auth-client';
import { safeNext } from '@/components/auth/credentials';
import { Text } from '@/components/ui/text';
import { space } from '@/components/ui/tokens';

import { AuthFrame } from './auth-frame';
import { SignInForm } from './sign-in-form';
import { TextLink } from './text-link';

export function SignInScreen({ next }: { next?: string }) {
  const router = useRouter();
  const session = authClient.useSession();
  const target = safeNext(next);
  if (session.data) return <Redirect href={target as never} />;
  const query = next ? `?next=${encodeURIComponent(target)}` : '';
  return (
    <AuthFrame title="Sign in" lead="Welcome back. Your Team’s Reviews are waiting." testID="sign-in-screen">
      <SignInForm onSignedIn={() => router.replace(target as never)} />
      <View style={styles.alt}>
        <Text tone="soft">New to Cyclemoot?</Text>
        <TextLink href={`/sign-up${query}` as never} label="Create an account" testID="to-sign-up" />
      </View>
    </AuthFrame>
  );
}

const styles = StyleSheet.create({
  alt: { flexDirection: 'row', alignItems: 'center', gap: space[1], flexWrap: 'wrap' },
});
