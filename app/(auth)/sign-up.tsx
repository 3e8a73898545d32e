import { useLocalSearchParams } from 'expo-router';

import { SignUpScreen } from '@/components/screens/auth/sign-up-screen';

export default function SignUpRoute() {
  const { next } = useLocalSearchParams<{ next?: string }>();
  return <SignUpScreen next={next} />;
}
