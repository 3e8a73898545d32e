import { Linking } from 'react-native';

import { Button } from '@/components/ui/button';

/** The PDF on a native build: the system opens the route and saves what it answers. */
export function PdfLink({ url, number, testID }: { url: string; number: number; testID: string }) {
  return (
    <Button
      label="↓ PDF"
      accessibilityLabel={`Download revision ${number} of the decision record as PDF`}
      variant="secondary"
      small
      onPress={() => void Linking.openURL(url)}
      testID={testID}
    />
  );
}
