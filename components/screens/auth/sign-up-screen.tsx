import { Redirect } from 'expo-router';

import { authClient } from '@/components/auth/auth-client';
import { safeNext } from '@/components/auth/credentials';

import { AuthFrame } from './auth-frame';
import { SignUpForm } from './sign-up-form';
import { OtherWayIn } from './text-link';

export function SignUpScreen({ next }: { next?: string }) {
  const session = authClient.useSession();
  const target = safeNext(next);
  if (session.data) return <Redirect href={target as never} />;
  return (
    <AuthFrame
      title="Create your account"
      lead="Then start a Team, or accept an invitation from one."
      testID="sign-up-screen"
    >
      <SignUpForm returnTo={target} />
      <OtherWayIn prompt="Already have an account?" path="/sign-in" next={next} label="Sign in" testID="to-sign-in" />
    </AuthFrame>
  );
}
