import { SettingsScreen } from '@/components/screens/settings/settings-screen';

export default function SettingsRoute() {
  return <SettingsScreen />;
}
