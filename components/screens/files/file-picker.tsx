import type { PickedFile } from '@/components/data/files';
import { Text } from '@/components/ui/text';

/** On a phone's native app there is no document picker in this build: attach from the web app. */
export function FilePicker(_props: { onPick: (file: PickedFile) => void; busy?: boolean; testID: string }) {
  return (
    <Text size="small" tone="muted">
      Attach files from the web app.
    </Text>
  );
}
