import { Linking } from 'react-native';

import { Button } from '@/components/ui/button';

/** A download on a native build: the system opens the export route and saves what it answers. */
export function DownloadLink({ url, label, testID }: { url: string; label: string; testID: string }) {
  return (
    <Button
      label={`↓ ${label}`}
      accessibilityLabel={`Download the comparison matrix as ${label}`}
      variant="secondary"
      small
      onPress={() => void Linking.openURL(url)}
      testID={testID}
    />
  );
}
