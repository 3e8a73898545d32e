import { useRef } from 'react';

import type { PickedFile } from '@/components/data/files';
import { Button } from '@/components/ui/button';
import { allowedExtensions, allowedFileTypes } from '@/server/contracts/files';

const accept = [...Object.keys(allowedFileTypes), ...allowedExtensions.map((e) => `.${e}`)].join(',');

/** The browser's own file chooser behind our button (a hidden `<input type=file>`). */
export function FilePicker({
  onPick,
  busy,
  testID,
}: {
  onPick: (file: PickedFile) => void;
  busy?: boolean;
  testID: string;
}) {
  const input = useRef<HTMLInputElement>(null);
  return (
    <>
      <input
        ref={input}
        type="file"
        accept={accept}
        data-testid={`${testID}-input`}
        aria-label="Choose a file to attach"
        style={{ display: 'none' }}
        onChange={(e) => {
          const file = e.currentTarget.files?.[0];
          e.currentTarget.value = '';
          if (file) onPick(file);
        }}
      />
      <Button label="Attach a file" busy={busy} onPress={() => input.current?.click()} testID={testID} />
    </>
  );
}
