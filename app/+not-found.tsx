import { NotFoundScreen } from '@/components/screens/root/not-found-screen';

export default function NotFound() {
  return <NotFoundScreen />;
}
