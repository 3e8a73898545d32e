import { Slot } from 'expo-router';

/** Signed-out pages: no navigation chrome. */
export default function AuthLayout() {
  return <Slot />;
}
