import { zodResolver } from '@hookform/resolvers/zod';
import { useMemo, useState } from 'react';
import { useForm, useWatch } from 'react-hook-form';
import { Pressable, StyleSheet, View, type NativeSyntheticEvent, type TextInputKeyPressEventData } from 'react-native';
import { z } from 'zod';

import { useBoardQuery, useCommentsQuery, useMentionableQuery, usePostCommentMutation } from '@/components/data/board';
import { Button } from '@/components/ui/button';
import { FormError, FormField } from '@/components/ui/field';
import { focusRing, type PressState } from '@/components/ui/focus';
import { formatAgo, formatDateTime } from '@/components/ui/format';
import { EmptyState, ErrorState, LoadingState } from '@/components/ui/states';
import { Text } from '@/components/ui/text';
import { useTheme } from '@/components/ui/theme';
import { radius, space, touchTarget } from '@/components/ui/tokens';
import { setServerErrors } from '@/components/ui/use-field';
import { commentBody, type Comment } from '@/server/contracts/board';
import { roleAllows } from '@/server/contracts/roles';

import { mentionQueryAt, newClientId } from './comment-text';

type Person = { id: string; name: string };

/**
 * The comments of a review (`candidateId` null) or of one candidate, with one level of
 * replies and a composer. Live arrival comes from `useReviewLiveUpdates`, which the screen
 * hosting the thread runs (the board, the candidate page).
 */
export function CommentThread({ reviewId, candidateId }: { reviewId: string; candidateId: string | null }) {
  const t = useTheme();
  const comments = useCommentsQuery(reviewId);
  const board = useBoardQuery(reviewId);
  const mentionable = useMentionableQuery(reviewId);
  const [replyTo, setReplyTo] = useState<string | null>(null);
  const canComment = !!board.data && roleAllows(board.data.myRole, { comment: ['create'] });
  const people = useMemo(() => mentionable.data ?? [], [mentionable.data]);
  const testID = `comments-${candidateId ?? 'review'}`;

  if (comments.error) return <ErrorState error={comments.error} onRetry={() => void comments.refetch()} />;
  if (!comments.data) return <LoadingState label="Loading comments…" />;

  const here = comments.data.filter((c) => (c.candidateId ?? null) === candidateId);
  const top = here.filter((c) => !c.parentId);
  const repliesOf = (id: string) => here.filter((c) => c.parentId === id);

  return (
    <View style={styles.thread} testID={testID}>
      {top.length === 0 ? (
        <EmptyState title="No comments yet" testID={`${testID}-empty`}>
          {canComment
            ? 'Start the discussion: type @ to name a team member.'
            : 'Comments from the team will appear here as they are posted.'}
        </EmptyState>
      ) : (
        top.map((c) => (
          <View key={c.id} style={[styles.item, { borderColor: t.hairline }]} testID="comment">
            <CommentBody comment={c} people={people} />
            {repliesOf(c.id).map((reply) => (
              <View key={reply.id} style={[styles.reply, { borderLeftColor: t.hairline }]} testID="comment-reply">
                <CommentBody comment={reply} people={people} />
              </View>
            ))}
            {canComment ? (
              replyTo === c.id ? (
                <View style={styles.reply}>
                  <CommentComposer
                    reviewId={reviewId}
                    candidateId={candidateId}
                    parentId={c.id}
                    people={people}
                    onDone={() => setReplyTo(null)}
                    testID="reply"
                  />
                </View>
              ) : (
                <Button
                  label="Reply"
                  accessibilityLabel={`Reply to ${c.author?.name ?? 'this comment'}`}
                  variant="quiet"
                  small
                  style={styles.replyButton}
                  onPress={() => setReplyTo(c.id)}
                  testID={`comment-reply-${c.id}`}
                />
              )
            ) : null}
          </View>
        ))
      )}
      {canComment ? (
        <CommentComposer
          reviewId={reviewId}
          candidateId={candidateId}
          parentId={null}
          people={people}
          testID="comment"
        />
      ) : board.data ? (
        <Text size="small" tone="muted">
          Observers read the discussion; commenting is for the Team’s Engineers, Reviewers, Lead and Owner.
        </Text>
      ) : null}
    </View>
  );
}

/** Author, time and the text, with each @mention of a member set apart. */
function CommentBody({ comment, people }: { comment: Comment; people: Person[] }) {
  const mentioned = people.filter((p) => comment.mentions.includes(p.id)).map((p) => `@${p.name}`);
  const parts = splitMentions(comment.body, mentioned);
  return (
    <View style={styles.body}>
      <View style={styles.meta}>
        <Text size="small" weight="semibold">
          {comment.author?.name ?? 'A former member'}
        </Text>
        <Text size="caption" tone="muted" accessibilityLabel={formatDateTime(comment.createdAt)}>
          {formatAgo(comment.createdAt)}
        </Text>
      </View>
      <Text size="small" testID="comment-body">
        {parts.map((p, i) =>
          p.mention ? (
            <Text key={i} size="small" weight="semibold" tone="cold">
              {p.text}
            </Text>
          ) : (
            p.text
          ),
        )}
      </Text>
    </View>
  );
}

function splitMentions(body: string, mentions: string[]): Array<{ text: string; mention: boolean }> {
  if (mentions.length === 0) return [{ text: body, mention: false }];
  const escaped = mentions.sort((a, b) => b.length - a.length).map((m) => m.replace(/[.*+?^${}()|[\]\\]/g, '\\$&'));
  return body
    .split(new RegExp(`(${escaped.join('|')})`, 'g'))
    .filter((s) => s !== '')
    .map((text) => ({ text, mention: mentions.includes(text) }));
}

// react-native-web renders any ARIA role; the native types list fewer.
const listboxRole = { role: 'listbox' } as object;

const composerSchema = z.object({ body: commentBody });

/**
 * One comment or reply: checked with the server's schema as you type (at most 5000
 * characters), @ opens member completion (arrow keys and Enter or Tab on a keyboard, a tap
 * on touch). The client id is made once per comment, so a retry after a lost answer is
 * stored once; a new one is made only after the server has kept the comment.
 */
function CommentComposer({
  reviewId,
  candidateId,
  parentId,
  people,
  onDone,
  testID,
}: {
  reviewId: string;
  candidateId: string | null;
  parentId: string | null;
  people: Person[];
  onDone?: () => void;
  testID: string;
}) {
  const t = useTheme();
  const post = usePostCommentMutation(reviewId);
  const [clientId, setClientId] = useState(newClientId);
  const [cursor, setCursor] = useState<number | null>(null);
  const [highlight, setHighlight] = useState(0);
  const [dismissedAt, setDismissedAt] = useState<number | null>(null);
  const { control, handleSubmit, setError, formState, setValue, reset } = useForm({
    resolver: zodResolver(composerSchema),
    mode: 'onChange',
    defaultValues: { body: '' },
  });
  const body = useWatch({ control, name: 'body' }) ?? '';
  const at = cursor ?? body.length;
  const query = mentionQueryAt(body, at);
  const matches =
    query && query.start !== dismissedAt
      ? people.filter((p) => p.name.toLowerCase().startsWith(query.text.toLowerCase())).slice(0, 6)
      : [];
  const open = matches.length > 0;
  const active = Math.min(highlight, Math.max(0, matches.length - 1));

  const pick = (person: Person) => {
    if (!query) return;
    const before = body.slice(0, query.start);
    const after = body.slice(at);
    const inserted = `@${person.name} `;
    setValue('body', before + inserted + after.replace(/^\s+/, ''), { shouldValidate: true, shouldDirty: true });
    setCursor(before.length + inserted.length);
    setHighlight(0);
  };

  const submit = handleSubmit(async ({ body: text }) => {
    try {
      await post.mutateAsync({ body: text, candidateId, parentId, clientId });
      setClientId(newClientId());
      reset({ body: '' });
      setCursor(null);
      onDone?.();
    } catch (error) {
      setServerErrors(error, setError, ['body']);
    }
  });
  const saving = formState.isSubmitting;

  const onKeyPress = (e: NativeSyntheticEvent<TextInputKeyPressEventData>) => {
    const key = e.nativeEvent.key;
    const prevent = () => (e as unknown as { preventDefault?: () => void }).preventDefault?.();
    if (open) {
      if (key === 'ArrowDown') {
        prevent();
        setHighlight((active + 1) % matches.length);
      } else if (key === 'ArrowUp') {
        prevent();
        setHighlight((active - 1 + matches.length) % matches.length);
      } else if (key === 'Enter' || key === 'Tab') {
        prevent();
        pick(matches[active]!);
      } else if (key === 'Escape') {
        prevent();
        setDismissedAt(query?.start ?? null);
      }
      return;
    }
    const mod = e.nativeEvent as unknown as { metaKey?: boolean; ctrlKey?: boolean };
    if (key === 'Enter' && (mod.metaKey || mod.ctrlKey)) {
      prevent();
      if (!saving) void submit();
    }
  };

  const left = 5000 - body.trim().length;
  return (
    <View style={styles.composer} testID={`${testID}-composer`}>
      <FormField
        control={control}
        name="body"
        label={parentId ? 'Your reply' : 'Your comment'}
        placeholder={parentId ? 'Reply…' : 'Comment… (type @ to name someone)'}
        multiline
        numberOfLines={3}
        autoFocus={!!parentId}
        onSelectionChange={(e) => setCursor(e.nativeEvent.selection.end)}
        onKeyPress={onKeyPress}
        hint={left < 500 ? `${left} characters left` : undefined}
        testID={`${testID}-input`}
        aria-autocomplete="list"
      />
      {open ? (
        <View
          {...listboxRole}
          accessibilityLabel="Team members to mention"
          style={[styles.mentions, { borderColor: t.hairline, backgroundColor: t.surfaceRaised }]}
          testID={`${testID}-mentions`}
        >
          {matches.map((p, i) => (
            <Pressable
              key={p.id}
              role="option"
              aria-selected={i === active}
              accessibilityLabel={`Mention ${p.name}`}
              onPress={() => pick(p)}
              testID={`${testID}-mention-option`}
              style={({ focused, hovered }: PressState) => [
                styles.option,
                (i === active || hovered) && { backgroundColor: t.surfaceSunk },
                focused && focusRing(t, true),
              ]}
            >
              <Text size="small" weight={i === active ? 'semibold' : 'regular'}>
                @{p.name}
              </Text>
            </Pressable>
          ))}
        </View>
      ) : null}
      <FormError message={formState.errors.root?.server?.message} testID={`${testID}-error`} />
      <View style={styles.actions}>
        {onDone ? <Button label="Cancel" variant="quiet" small onPress={onDone} testID={`${testID}-cancel`} /> : null}
        <Button
          label={parentId ? 'Post reply' : 'Post comment'}
          small
          busy={saving}
          onPress={() => {
            if (!saving) void submit();
          }}
          testID={`${testID}-post`}
        />
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  thread: { gap: space[1] + space.half },
  item: { borderBottomWidth: 1, paddingBottom: space[1], gap: space[1] },
  body: { gap: 2 },
  meta: { flexDirection: 'row', alignItems: 'baseline', gap: space[1], flexWrap: 'wrap' },
  reply: { marginLeft: space[2], paddingLeft: space[1] + space.half, borderLeftWidth: 2 },
  replyButton: { alignSelf: 'flex-start' },
  composer: { gap: space[1] },
  mentions: { borderWidth: 1, borderRadius: radius.control, overflow: 'hidden' },
  option: { minHeight: touchTarget, justifyContent: 'center', paddingHorizontal: space[1] + space.half },
  actions: { flexDirection: 'row', justifyContent: 'flex-end', gap: space[1] },
});
