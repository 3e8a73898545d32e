import { Redirect, useRouter } from 'expo-router';

import { authClient } from '@/components/auth/auth-client';
import { safeNext } from '@/components/auth/credentials';
import { Text } from '@/components/ui/text';

import { AuthFrame } from './auth-frame';
import { SignInForm } from './sign-in-form';
import { OtherWayIn } from './text-link';

/**
 * Sign-in; also where a mailed confirmation link lands. Signed in by the link, the person
 * goes straight on; a link that expired or was used already comes back with `linkError`.
 */
export function SignInScreen({ next, linkError }: { next?: string; linkError?: string }) {
  const router = useRouter();
  const session = authClient.useSession();
  const target = safeNext(next);
  if (session.data) return <Redirect href={target as never} />;
  return (
    <AuthFrame title="Sign in" lead="Welcome back. Your Team’s Reviews are waiting." testID="sign-in-screen">
      {linkError ? (
        <Text tone="soft" testID="sign-in-link-error">
          That confirmation link has expired or was used already. Sign in with your e-mail and password and we will mail
          you a new one.
        </Text>
      ) : null}
      <SignInForm returnTo={target} onSignedIn={() => router.replace(target as never)} />
      <OtherWayIn
        prompt="New to Cyclemoot?"
        path="/sign-up"
        next={next}
        label="Create an account"
        testID="to-sign-up"
      />
    </AuthFrame>
  );
}
