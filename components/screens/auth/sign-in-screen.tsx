import { Redirect, useRouter } from 'expo-router';

import { authClient } from '@/components/auth/auth-client';
import { safeNext } from '@/components/auth/credentials';

import { AuthFrame } from './auth-frame';
import { SignInForm } from './sign-in-form';
import { OtherWayIn } from './text-link';

export function SignInScreen({ next }: { next?: string }) {
  const router = useRouter();
  const session = authClient.useSession();
  const target = safeNext(next);
  if (session.data) return <Redirect href={target as never} />;
  return (
    <AuthFrame title="Sign in" lead="Welcome back. Your Team’s Reviews are waiting." testID="sign-in-screen">
      <SignInForm onSignedIn={() => router.replace(target as never)} />
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
