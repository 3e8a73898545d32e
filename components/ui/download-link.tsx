import { Linking } from 'react-native';

import { Button } from '@/components/ui/button';

export type DownloadLinkProps = {
  url: string;
  /** What shows after the arrow: the format (CSV, XLSX, PDF). */
  label: string;
  /** What is downloaded, for a screen reader ("Download revision 2 of the decision record as PDF"). */
  accessibilityLabel: string;
  testID: string;
};

/** A download on a native build: the system opens the route and saves what it answers. */
export function DownloadLink({ url, label, accessibilityLabel, testID }: DownloadLinkProps) {
  return (
    <Button
      label={`↓ ${label}`}
      accessibilityLabel={accessibilityLabel}
      variant="secondary"
      small
      onPress={() => void Linking.openURL(url)}
      testID={testID}
    />
  );
}
