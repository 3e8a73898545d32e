import { useLocalSearchParams } from 'expo-router';

import { SignInScreen } from '@/components/screens/auth/sign-in-screen';

export default function SignInRoute() {
  const { next, error } = useLocalSearchParams<{ next?: string; error?: string }>();
  return <SignInScreen next={next} linkError={error} />;
}
