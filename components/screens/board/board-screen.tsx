import { useRouter } from 'expo-router';
import { useCallback, useEffect, useMemo, useRef, useState } from 'react';
import { ScrollView, StyleSheet, View } from 'react-native';

import { gatherRoom, reportViewing, useBoardQuery, usePresence, useReviewLiveUpdates } from '@/components/data/board';
import { useMeQuery } from '@/components/data/me';
import { useSiteYearLiveUpdates } from '@/components/data/site-year';
import { useTeamLiveUpdates } from '@/components/data/team-live-updates';
import { FilesPanel } from '@/components/screens/files/files-panel';
import { useCurrentTeam } from '@/components/state/current-team';
import { BackLink } from '@/components/ui/back-link';
import { Button } from '@/components/ui/button';
import { CautionLine } from '@/components/ui/caution-line';
import { useDocumentTitle } from '@/components/ui/document-title';
import { Choice } from '@/components/ui/field';
import { useIsWide } from '@/components/ui/layout';
import { useMessage } from '@/components/ui/message';
import { EmptyState, ErrorState, LoadingState } from '@/components/ui/states';
import { Heading, Text } from '@/components/ui/text';
import { useTheme } from '@/components/ui/theme';
import { space } from '@/components/ui/tokens';
import { roleAllows } from '@/server/contracts/roles';

import { AddCandidateForm } from './add-candidate-form';
import { BoardBar } from './board-bar';
import { CandidateCard, candidateHref } from './candidate-card';
import { CardPager } from './card-pager';
import { CommentThread } from './comment-thread';
import { OverlayDiagram } from './diagram-slots';
import { bestValues } from './figures';
import { GatherBanner } from './gather-banner';
import { PresenceList } from './presence-list';
import { ReviewDetails } from './review-details';
import { RoundPanel } from './round-panel';
import { useBoardKeys } from './use-board-keys';
import { useFollow } from './use-follow';

type View_ = 'cards' | 'overlay';
type PhoneTab = 'comments' | 'round' | 'here' | 'files';

/** A gather answer that is not `{ ok: true }` becomes an error for the message line. */
async function sendGather(reviewId: string, candidateId: string | null) {
  const ack = (await gatherRoom(reviewId, candidateId)) as { ok?: boolean; error?: { message?: string } } | undefined;
  if (ack && ack.ok === false) throw new Error(ack.error?.message ?? 'The room could not be gathered.');
  if (ack?.error) throw new Error(ack.error.message ?? 'The room could not be gathered.');
}

/**
 * The live review board. Phone: a paged stack of candidate cards, a tab row for comments,
 * the preference round and who is here, and the Review's bar (Board · Matrix · Decision ·
 * Activity). Wide: a grid of cards and a right-hand panel with the same three.
 */
export function BoardScreen({ reviewId }: { reviewId: string }) {
  const router = useRouter();
  const t = useTheme();
  const wide = useIsWide();
  const message = useMessage();
  const board = useBoardQuery(reviewId);
  const me = useMeQuery();
  const meId = me.data?.user.id;
  const presence = usePresence(reviewId);
  const { team, teams, selectTeam } = useCurrentTeam();
  useTeamLiveUpdates(board.data?.review.teamId);
  useDocumentTitle(board.data?.review.name ?? 'Review');

  // Opening a link to another of my Teams' Reviews makes that Team current.
  const reviewTeamId = board.data?.review.teamId;
  useEffect(() => {
    if (reviewTeamId && reviewTeamId !== team?.id && teams.some((x) => x.id === reviewTeamId)) selectTeam(reviewTeamId);
  }, [reviewTeamId, team?.id, teams, selectTeam]);

  // ── Gather the room ───────────────────────────────────────────────────────────────
  useReviewLiveUpdates(reviewId);
  useSiteYearLiveUpdates(reviewId);
  const data = board.data;
  const candidates = useMemo(() => data?.candidates ?? [], [data?.candidates]);
  const follow = useFollow(reviewId, data, meId);
  const { gathering, following, iGather } = follow;

  const [ownId, setOwnId] = useState<string | null>(null);
  const ownValid = ownId && candidates.some((c) => c.id === ownId) ? ownId : null;
  const shownId = following ? gathering!.candidateId : ownValid;
  // The phone always shows a card; the wide board may have none selected.
  const phoneId = shownId ?? candidates[0]?.id ?? null;
  const viewingId = wide ? shownId : phoneId;

  /** A place I move to myself: stops following someone else; moves my own gathering. */
  const select = useCallback(
    (id: string | null) => {
      setOwnId(id);
      if (following && id !== gathering!.candidateId) follow.stopFollowing();
      if (iGather && id && id !== gathering!.candidateId) sendGather(reviewId, id).catch(message.showError);
    },
    [following, iGather, gathering, reviewId, message.showError, follow],
  );
  const stopFollowing = useCallback(() => {
    if (!gathering) return;
    setOwnId(gathering.candidateId);
    follow.stopFollowing();
  }, [gathering, follow]);

  // A follower's phone opens the gathered candidate's detail page, once per place the
  // gatherer takes the room (back on the board, it stays there until the gatherer moves on).
  const { placeKey, opened, markOpened } = follow;
  useEffect(() => {
    if (wide || !following || !placeKey || opened === placeKey) return;
    markOpened(placeKey);
    router.push(candidateHref(reviewId, gathering!.candidateId));
  }, [wide, following, placeKey, opened, markOpened, router, reviewId, gathering]);
  const gather = (id: string) => {
    setOwnId(id);
    sendGather(reviewId, id).catch(message.showError);
  };
  const stopGathering = () => sendGather(reviewId, null).catch(message.showError);

  // Tell the room what I look at; again whenever the room's list says otherwise (a rejoin).
  const mineAt = presence.data?.find((p) => p.userId === meId)?.candidateId;
  useEffect(() => {
    if (!data || mineAt === undefined || mineAt === viewingId) return;
    reportViewing(reviewId, viewingId);
  }, [reviewId, viewingId, mineAt, data]);

  // ── Layout state ──────────────────────────────────────────────────────────────────
  const [view, setView] = useState<View_>('cards');
  const [adding, setAdding] = useState(false);
  const [details, setDetails] = useState(false);
  const [tab, setTab] = useState<PhoneTab>('comments');
  const [threadOnReview, setThreadOnReview] = useState(false);
  const main = useRef<ScrollView>(null);
  const cardY = useRef<Record<string, number>>({});
  const panelY = useRef(0);
  const [gridWidth, setGridWidth] = useState(0);

  const phoneIndex = Math.max(
    0,
    candidates.findIndex((c) => c.id === phoneId),
  );
  useBoardKeys({
    onEscape: following ? stopFollowing : undefined,
    onLeft: !wide && view === 'cards' && phoneIndex > 0 ? () => select(candidates[phoneIndex - 1]!.id) : undefined,
    onRight:
      !wide && view === 'cards' && phoneIndex < candidates.length - 1
        ? () => select(candidates[phoneIndex + 1]!.id)
        : undefined,
  });

  // A follower's wide board scrolls the gathered card into view.
  const followedId = following ? gathering!.candidateId : null;
  useEffect(() => {
    if (!wide || !followedId) return;
    const y = cardY.current[followedId];
    if (y !== undefined) main.current?.scrollTo({ y: Math.max(0, y - space[2]), animated: true });
  }, [wide, followedId]);

  const best = useMemo(() => bestValues(candidates), [candidates]);
  const named = useMemo(() => candidates.map((c) => ({ id: c.id, name: c.name, colour: c.colour })), [candidates]);

  const back = <BackLink href="/" to="Reviews" label="Back to reviews" testID="back-to-reviews" />;

  if (board.error) {
    return (
      <ScrollView style={{ backgroundColor: t.surface }} contentContainerStyle={styles.pad} testID="board-screen">
        {back}
        <Heading level={1}>Review</Heading>
        <ErrorState error={board.error} onRetry={() => void board.refetch()} />
      </ScrollView>
    );
  }
  if (!data) {
    return (
      <View style={[styles.fill, { backgroundColor: t.surface }]} testID="board-screen">
        <LoadingState label="Loading the board…" />
      </View>
    );
  }

  const canCreate = roleAllows(data.myRole, { candidate: ['create'] });
  const canGather = roleAllows(data.myRole, { liveSession: ['gather'] });
  const threadId = wide ? shownId : threadOnReview ? null : phoneId;
  const gatheredName = gathering ? candidates.find((c) => c.id === gathering.candidateId)?.name : undefined;

  const card = (id: string) => {
    const c = candidates.find((x) => x.id === id)!;
    return (
      <CandidateCard
        reviewId={reviewId}
        candidate={c}
        colour={c.colour}
        best={best}
        round={data.round}
        commentCount={data.commentCounts[c.id] ?? 0}
        selected={wide && shownId === c.id}
        gatheredHere={gathering?.candidateId === c.id}
        canGather={canGather}
        onGather={() => gather(c.id)}
        onDiscuss={() => {
          select(c.id);
          if (!wide) {
            setTab('comments');
            setThreadOnReview(false);
            main.current?.scrollTo({ y: panelY.current, animated: true });
          }
        }}
      />
    );
  };

  const header = (
    <View style={styles.header}>
      <View style={styles.headRow}>{back}</View>
      <View style={styles.titleRow}>
        <View style={styles.titleText}>
          <Text size="small" tone="muted" numberOfLines={1}>
            Review · {teams.find((x) => x.id === data.review.teamId)?.name ?? ''}
            {data.review.status === 'archived' ? ' · archived' : ''}
          </Text>
          <Heading level={1}>{data.review.name}</Heading>
        </View>
        <View style={styles.actions}>
          <Button
            label="Design basis"
            variant="quiet"
            small
            onPress={() => router.push(`/reviews/${encodeURIComponent(reviewId)}/basis`)}
            testID="design-basis-open"
          />
          <Button
            label="Site year"
            variant="quiet"
            small
            onPress={() => router.push(`/reviews/${encodeURIComponent(reviewId)}/site-year`)}
            testID="site-year-open"
          />
          <Button
            label="Review details"
            variant={details ? 'secondary' : 'quiet'}
            small
            onPress={() => setDetails((d) => !d)}
            testID="review-details-toggle"
          />
          {canCreate ? (
            <Button
              label="Add candidate"
              small
              onPress={() => setAdding((a) => !a)}
              disabled={adding}
              testID="add-candidate-toggle"
            />
          ) : null}
        </View>
      </View>
      {wide ? <BoardBar reviewId={reviewId} current="board" layout="tabs" /> : null}
      {details ? <ReviewDetails review={data.review} myRole={data.myRole} onClose={() => setDetails(false)} /> : null}
      {adding ? (
        <AddCandidateForm
          reviewId={reviewId}
          candidates={candidates}
          onDone={(c) => {
            setAdding(false);
            if (c) select(c.id);
          }}
        />
      ) : null}
      <GatherBanner
        board={data}
        gatheredName={gatheredName}
        following={following}
        iGather={iGather}
        stopped={follow.stopped}
        onStopFollowing={stopFollowing}
        onFollowAgain={follow.followAgain}
        onStopGathering={stopGathering}
        detailHref={!wide && gathering ? candidateHref(reviewId, gathering.candidateId) : undefined}
      />
      {candidates.length > 1 ? (
        <Choice
          label="Show"
          value={view}
          onChange={setView}
          options={[
            { value: 'cards', label: 'Cards' },
            { value: 'overlay', label: 'All loops on one T-s diagram' },
          ]}
          testID="board-view"
        />
      ) : null}
    </View>
  );

  const empty = (
    <EmptyState
      title="No candidates yet"
      testID="candidates-empty"
      action={
        canCreate && !adding ? (
          <Button label="Add the first candidate" onPress={() => setAdding(true)} testID="add-first-candidate" />
        ) : null
      }
    >
      {canCreate
        ? 'Add a candidate from a preset — Simple, Regenerative, Intercooled, Reheat or Intercooled + reheat + regenerative — and the server computes it with this Review’s design basis. Each one then appears here for the whole team.'
        : 'The Lead or an Engineer adds the candidates; each appears here as soon as the server has computed it.'}
    </EmptyState>
  );

  const overlay = (
    <View style={styles.gap} testID="board-overlay">
      <OverlayDiagram candidates={candidates} />
    </View>
  );

  const sections = {
    here: <PresenceList reviewId={reviewId} candidates={named} meId={meId} />,
    round: <RoundPanel reviewId={reviewId} board={data} candidates={named} />,
    comments: (
      <View style={styles.gap}>
        <View style={styles.threadHead}>
          <Text size="small" weight="semibold" style={styles.grow} testID="thread-scope">
            {threadId ? `On ${candidates.find((c) => c.id === threadId)?.name ?? 'the candidate'}` : 'On the review'}
          </Text>
          {threadId ? (
            <Button
              label="The review’s comments"
              variant="quiet"
              small
              onPress={() => (wide ? select(null) : setThreadOnReview(true))}
              testID="thread-to-review"
            />
          ) : !wide && phoneId ? (
            <Button
              label="This candidate’s comments"
              variant="quiet"
              small
              onPress={() => setThreadOnReview(false)}
              testID="thread-to-candidate"
            />
          ) : null}
        </View>
        <CommentThread key={threadId ?? 'review'} reviewId={reviewId} candidateId={threadId} />
      </View>
    ),
    files: <FilesPanel reviewId={reviewId} />,
  };

  if (wide) {
    const gap = space[2];
    const cols = Math.max(1, Math.floor((gridWidth + gap) / (300 + gap)));
    const cardWidth = gridWidth ? (gridWidth - gap * (cols - 1)) / cols : undefined;
    return (
      <View style={[styles.fill, styles.wideRow, { backgroundColor: t.surface }]} testID="board-screen">
        <ScrollView ref={main} style={styles.fill} contentContainerStyle={styles.widePad}>
          {header}
          {candidates.length === 0 ? (
            empty
          ) : view === 'overlay' ? (
            overlay
          ) : (
            <View
              style={[styles.grid, { gap }]}
              onLayout={(e) => setGridWidth(Math.floor(e.nativeEvent.layout.width))}
              testID="card-grid"
            >
              {candidates.map((c) => (
                <View
                  key={c.id}
                  style={{ width: cardWidth }}
                  onLayout={(e) => {
                    cardY.current[c.id] = e.nativeEvent.layout.y;
                  }}
                >
                  {card(c.id)}
                </View>
              ))}
            </View>
          )}
          <CautionLine />
        </ScrollView>
        <ScrollView
          style={[styles.panel, { borderLeftColor: t.hairline, backgroundColor: t.surfaceRaised }]}
          contentContainerStyle={styles.panelPad}
          testID="board-panel"
        >
          <PanelSection title="Who is here">{sections.here}</PanelSection>
          <PanelSection title="Preference round">{sections.round}</PanelSection>
          <PanelSection title="Comments">{sections.comments}</PanelSection>
          <PanelSection title="Files">{sections.files}</PanelSection>
        </ScrollView>
      </View>
    );
  }

  return (
    <View style={[styles.fill, { backgroundColor: t.surface }]} testID="board-screen">
      <ScrollView ref={main} style={styles.fill} contentContainerStyle={styles.pad} keyboardShouldPersistTaps="handled">
        {header}
        {candidates.length === 0 ? (
          empty
        ) : view === 'overlay' ? (
          overlay
        ) : (
          <CardPager pages={named} index={phoneIndex} onPage={(i) => select(candidates[i]!.id)}>
            {(i) => card(candidates[i]!.id)}
          </CardPager>
        )}
        <View
          style={[styles.phonePanel, { borderTopColor: t.hairline }]}
          onLayout={(e) => {
            panelY.current = e.nativeEvent.layout.y;
          }}
        >
          <Choice
            label="On this board"
            value={tab}
            onChange={setTab}
            options={[
              { value: 'comments', label: 'Comments' },
              { value: 'round', label: 'Preference round' },
              { value: 'here', label: `Who is here (${presence.data?.length ?? 0})` },
              { value: 'files', label: 'Files' },
            ]}
            testID="board-tab"
          />
          {sections[tab]}
        </View>
        <CautionLine />
      </ScrollView>
      <BoardBar reviewId={reviewId} current="board" layout="bar" />
    </View>
  );
}

function PanelSection({ title, children }: { title: string; children: React.ReactNode }) {
  const t = useTheme();
  return (
    <View style={[styles.section, { borderBottomColor: t.hairline }]}>
      <Heading level={2}>{title}</Heading>
      {children}
    </View>
  );
}

const styles = StyleSheet.create({
  fill: { flex: 1 },
  grow: { flex: 1, minWidth: 160 },
  gap: { gap: space[1] + space.half },
  pad: { padding: space[2], gap: space[2], paddingBottom: space[4] },
  widePad: { padding: space[4], gap: space[2], paddingBottom: space[6] },
  wideRow: { flexDirection: 'row' },
  header: { gap: space[2] },
  headRow: { flexDirection: 'row', alignItems: 'center' },
  titleRow: { flexDirection: 'row', alignItems: 'flex-end', gap: space[2], flexWrap: 'wrap' },
  titleText: { flex: 1, minWidth: 200 },
  // Wraps within the screen's width (a phone puts the buttons on two lines).
  actions: { flexDirection: 'row', gap: space[1], flexWrap: 'wrap', flexShrink: 1, maxWidth: '100%' },
  grid: { flexDirection: 'row', flexWrap: 'wrap', alignItems: 'flex-start' },
  panel: { width: 380, flexGrow: 0, borderLeftWidth: 1 },
  panelPad: { padding: space[2], gap: space[2] },
  section: { gap: space[1] + space.half, borderBottomWidth: 1, paddingBottom: space[2] },
  phonePanel: { borderTopWidth: 1, paddingTop: space[2], gap: space[2] },
  threadHead: { flexDirection: 'row', alignItems: 'center', gap: space[1], flexWrap: 'wrap' },
});
