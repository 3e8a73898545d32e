import { Linking, Platform, StyleSheet, View } from 'react-native';

import { useBoardQuery } from '@/components/data/board';
import {
  fileDownloadURL,
  useDeleteFileMutation,
  useFilesLiveUpdates,
  useFilesQuery,
  useUploadFileMutation,
  type PickedFile,
} from '@/components/data/files';
import { useMeQuery } from '@/components/data/me';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { formatAgo, formatDateTime } from '@/components/ui/format';
import { useMessage } from '@/components/ui/message';
import { messageFor } from '@/components/ui/message-for';
import { EmptyState, ErrorState, LoadingState } from '@/components/ui/states';
import { Heading, Text } from '@/components/ui/text';
import { useTheme } from '@/components/ui/theme';
import { space } from '@/components/ui/tokens';
import { fileTypeLabel, maxFileBytes, type StoredFile } from '@/server/contracts/files';
import { roleAllows } from '@/server/contracts/roles';

import { FilePicker } from './file-picker';
import { showSize } from './file-size';

function download(file: StoredFile) {
  const url = fileDownloadURL(file.id);
  if (Platform.OS === 'web') {
    // An attachment: the browser saves it and the page stays.
    const a = document.createElement('a');
    a.href = url;
    a.download = file.name;
    document.body.appendChild(a);
    a.click();
    a.remove();
  } else void Linking.openURL(url);
}

/**
 * The Files of a Review, or of one candidate with `candidateId`: the list (name, size, type,
 * who, when), attaching through the device's file chooser with progress, downloading, and
 * deleting for whom the role allows (the Lead and Owner any file, the uploader their own).
 * Live: files others attach or delete appear and go without a reload.
 */
export function FilesPanel({ reviewId, candidateId }: { reviewId: string; candidateId?: string }) {
  const t = useTheme();
  const board = useBoardQuery(reviewId);
  const me = useMeQuery();
  const files = useFilesQuery(reviewId);
  useFilesLiveUpdates(reviewId);
  const upload = useUploadFileMutation(reviewId, candidateId);
  const remove = useDeleteFileMutation(reviewId);
  const message = useMessage();

  const role = board.data?.myRole;
  const myId = me.data?.user.id;
  const canUpload = role ? roleAllows(role, { file: ['upload'] }) : false;
  const mayDelete = (f: StoredFile) =>
    !!role && (roleAllows(role, { file: ['delete'] }) || (canUpload && f.uploadedBy?.id === myId));
  const candidateName = (id: string | null) => board.data?.candidates.find((c) => c.id === id)?.name;

  const pick = (file: PickedFile) => {
    if (file.size > maxFileBytes) {
      message.show(`“${file.name}” is ${showSize(file.size)}; a file may be at most 20 MB.`);
      return;
    }
    upload.mutate(file);
  };

  const shown = (files.data ?? []).filter((f) => !candidateId || f.candidateId === candidateId);
  const progress = upload.progress;
  const percent =
    progress && progress.totalBytes > 0 ? Math.round((100 * progress.sentBytes) / progress.totalBytes) : 0;

  return (
    <Card style={styles.card} testID="files-panel">
      <View style={styles.head}>
        <Heading level={2}>Files</Heading>
        {canUpload ? <FilePicker onPick={pick} busy={upload.isPending} testID="attach-file" /> : null}
      </View>
      <Text size="small" tone="muted">
        Datasheets, site data and sketches{candidateId ? ' for this candidate' : ''}: PDF, PNG, JPEG, CSV or XLSX, at
        most 20 MB each.
      </Text>
      {progress ? (
        <View accessibilityLabel={`Uploading, ${percent} %`} testID="upload-progress">
          <View style={[styles.track, { backgroundColor: t.hairline }]}>
            <View style={[styles.bar, { backgroundColor: t.accent, width: `${percent}%` }]} />
          </View>
          <Text size="small" tone="soft" mono>
            {showSize(progress.sentBytes)} of {showSize(progress.totalBytes)} sent ({percent} %)
          </Text>
        </View>
      ) : null}
      {upload.error ? (
        <Text size="small" tone="danger" role="alert" testID="upload-error">
          Not attached: {messageFor(upload.error)}
        </Text>
      ) : null}
      {files.error ? (
        <ErrorState error={files.error} onRetry={() => void files.refetch()} testID="files-error" />
      ) : files.isPending ? (
        <LoadingState label="Loading files…" />
      ) : shown.length === 0 ? (
        <EmptyState title="No files yet" testID="files-empty">
          {canUpload ? 'Attach a datasheet, site data or a sketch.' : 'Files the team attaches show here.'}
        </EmptyState>
      ) : (
        <View style={styles.list} testID="files-list">
          {shown.map((f) => (
            <View key={f.id} style={[styles.row, { borderColor: t.hairline }]} testID={`file-${f.id}`}>
              <View style={styles.info}>
                <Text weight="medium" numberOfLines={2} testID="file-name">
                  {f.name}
                </Text>
                <Text size="small" tone="soft">
                  <Text size="small" mono testID="file-size">
                    {showSize(f.sizeBytes)}
                  </Text>
                  {` · ${fileTypeLabel(f.contentType)}`}
                  {!candidateId && f.candidateId && candidateName(f.candidateId)
                    ? ` · for “${candidateName(f.candidateId)}”`
                    : ''}
                </Text>
                <Text size="small" tone="muted" accessibilityLabel={formatDateTime(f.createdAt)}>
                  {f.uploadedBy?.name ?? 'A former member'} · {formatAgo(f.createdAt)}
                </Text>
              </View>
              <View style={styles.actions}>
                <Button
                  label="Download"
                  accessibilityLabel={`Download ${f.name}`}
                  variant="secondary"
                  small
                  onPress={() => download(f)}
                  testID={`download-${f.id}`}
                />
                {mayDelete(f) ? (
                  <Button
                    label="Delete"
                    accessibilityLabel={`Delete ${f.name}`}
                    variant="quiet"
                    small
                    busy={remove.isPending && remove.variables === f.id}
                    onPress={() =>
                      remove.mutate(f.id, {
                        onError: (error) => message.show(`“${f.name}” was not deleted: ${messageFor(error)}`),
                      })
                    }
                    testID={`delete-${f.id}`}
                  />
                ) : null}
              </View>
            </View>
          ))}
        </View>
      )}
    </Card>
  );
}

const styles = StyleSheet.create({
  card: { gap: space[2] },
  head: {
    flexDirection: 'row',
    alignItems: 'center',
    justifyContent: 'space-between',
    gap: space[2],
    flexWrap: 'wrap',
  },
  list: { gap: 0 },
  row: {
    flexDirection: 'row',
    flexWrap: 'wrap',
    alignItems: 'center',
    gap: space[2],
    paddingVertical: space[2],
    borderTopWidth: StyleSheet.hairlineWidth,
  },
  info: { flex: 1, minWidth: 180, gap: 2 },
  actions: { flexDirection: 'row', gap: space[1] },
  track: { height: 6, borderRadius: 3, overflow: 'hidden' },
  bar: { height: 6 },
});
