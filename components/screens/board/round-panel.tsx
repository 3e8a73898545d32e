import { useState } from 'react';
import { StyleSheet, View } from 'react-native';

import {
  useBallotMutation,
  useCloseRoundMutation,
  useOpenRoundMutation,
  useRoundsQuery,
} from '@/components/data/board';
import { Button } from '@/components/ui/button';
import { Choice } from '@/components/ui/field';
import { count, formatDateTime } from '@/components/ui/format';
import { useMessage } from '@/components/ui/message';
import { Heading, Text } from '@/components/ui/text';
import { useTheme } from '@/components/ui/theme';
import { radius, space } from '@/components/ui/tokens';
import { openRoundInput, type Board, type Round } from '@/server/contracts/board';
import { roleAllows } from '@/server/contracts/roles';

type Named = { id: string; name: string; colour: string };

/**
 * The preference round: the Lead opens one (votes per person, blind or open tallies) and
 * closes it; each Engineer, Reviewer and the Lead spreads their votes with steppers and may
 * change the ballot while it is open; everyone sees how many voted, the Lead sees who.
 */
export function RoundPanel({ reviewId, board, candidates }: { reviewId: string; board: Board; candidates: Named[] }) {
  const round = board.round;
  const canRun = roleAllows(board.myRole, { round: ['open', 'close'] });
  const canVote = roleAllows(board.myRole, { vote: ['cast'] });
  const rounds = useRoundsQuery(reviewId);
  const earlier = (rounds.data ?? [])
    .filter((r) => r.status === 'closed' && r.id !== round?.id)
    .sort((a, b) => b.number - a.number);

  return (
    <View style={styles.panel} testID="round-panel">
      {round && round.status === 'open' ? (
        <OpenRound
          key={round.id}
          reviewId={reviewId}
          round={round}
          candidates={candidates}
          canRun={canRun}
          canVote={canVote}
        />
      ) : (
        <>
          {round ? <ClosedRound round={round} candidates={candidates} /> : null}
          {canRun ? (
            <OpenRoundForm reviewId={reviewId} disabled={candidates.length === 0} />
          ) : !round ? (
            <Text size="small" tone="muted" testID="round-none">
              No preference round yet. The Lead opens one when the candidates are ready to weigh.
            </Text>
          ) : null}
        </>
      )}
      {earlier.length > 0 ? <EarlierRounds rounds={earlier} candidates={candidates} /> : null}
    </View>
  );
}

function OpenRoundForm({ reviewId, disabled }: { reviewId: string; disabled: boolean }) {
  const open = useOpenRoundMutation(reviewId);
  const message = useMessage();
  const [votes, setVotes] = useState(3);
  const [mode, setMode] = useState<'open' | 'blind'>('blind');
  const input = { votesPerPerson: votes, blind: mode === 'blind' };
  const check = openRoundInput.safeParse(input);
  return (
    <View style={styles.section} testID="open-round-form">
      <Heading level={3}>Open a preference round</Heading>
      <Stepper
        label="Votes per person"
        value={votes}
        min={1}
        max={20}
        onChange={setVotes}
        testID="round-votes-per-person"
      />
      <Choice
        label="Tallies"
        value={mode}
        onChange={setMode}
        options={[
          { value: 'blind', label: 'Blind until closed' },
          { value: 'open', label: 'Shown as votes come in' },
        ]}
        testID="round-mode"
      />
      {!check.success ? (
        <Text size="small" tone="danger" role="alert">
          {check.error.issues[0]?.message}
        </Text>
      ) : null}
      <Button
        label="Open round"
        busy={open.isPending}
        disabled={disabled || !check.success}
        onPress={() => open.mutate(input, { onError: message.showError })}
        testID="round-open"
      />
      {disabled ? (
        <Text size="small" tone="muted">
          Add a candidate first.
        </Text>
      ) : null}
    </View>
  );
}

function OpenRound({
  reviewId,
  round,
  candidates,
  canRun,
  canVote,
}: {
  reviewId: string;
  round: Round;
  candidates: Named[];
  canRun: boolean;
  canVote: boolean;
}) {
  const close = useCloseRoundMutation(reviewId, round.id);
  const message = useMessage();
  return (
    <View style={styles.section} testID="round-open-panel">
      <Heading level={3}>Preference round {round.number} · open</Heading>
      <Text size="small" tone="soft">
        {count(round.votesPerPerson, 'vote', 'votes')} each ·{' '}
        {round.blind ? 'blind: tallies shown when it closes' : 'tallies shown as votes come in'}
      </Text>
      <Text weight="semibold" testID="round-voters">
        {count(round.voters, 'person has', 'people have')} voted
      </Text>
      {round.votedBy ? (
        <Text size="small" tone="soft" testID="round-voted-by">
          {round.votedBy.length ? `Voted: ${round.votedBy.map((p) => p.name).join(', ')}` : 'Nobody has voted yet.'}
        </Text>
      ) : null}
      {canVote ? <Ballot reviewId={reviewId} round={round} candidates={candidates} /> : null}
      {round.tally ? <Tally round={round} candidates={candidates} /> : null}
      {canRun ? (
        <Button
          label="Close round"
          variant="secondary"
          busy={close.isPending}
          onPress={() => close.mutate(undefined, { onError: message.showError })}
          testID="round-close"
        />
      ) : null}
    </View>
  );
}

/** My votes, spread with steppers; never more than the round allows, the rest shown. */
function Ballot({ reviewId, round, candidates }: { reviewId: string; round: Round; candidates: Named[] }) {
  const ballot = useBallotMutation(reviewId, round.id);
  const message = useMessage();
  const [draft, setDraft] = useState<Record<string, number>>(() => ({ ...(round.myBallot ?? {}) }));
  const spent = candidates.reduce((sum, c) => sum + (draft[c.id] ?? 0), 0);
  const left = round.votesPerPerson - spent;
  const saved = round.myBallot;
  const unchanged = !!saved && candidates.every((c) => (saved[c.id] ?? 0) === (draft[c.id] ?? 0));
  return (
    <View style={[styles.ballot]} testID="ballot">
      <Text size="small" weight="semibold" testID="ballot-left" aria-live="polite">
        {left === 0 ? 'All your votes are placed' : `${count(left, 'vote', 'votes')} left to place`}
      </Text>
      {candidates.map((c) => (
        <Stepper
          key={c.id}
          label={c.name}
          colour={c.colour}
          value={draft[c.id] ?? 0}
          min={0}
          max={(draft[c.id] ?? 0) + left}
          onChange={(n) => setDraft((d) => ({ ...d, [c.id]: n }))}
          testID={`ballot-${c.id}`}
        />
      ))}
      <Button
        label={saved ? (unchanged ? 'Ballot saved' : 'Change my ballot') : 'Cast my ballot'}
        busy={ballot.isPending}
        disabled={unchanged || spent === 0}
        onPress={() => {
          const votes = Object.fromEntries(candidates.map((c) => [c.id, draft[c.id] ?? 0]));
          ballot.mutate(votes, { onError: message.showError });
        }}
        testID="ballot-save"
      />
      {saved ? (
        <Text size="small" tone="muted">
          You may change it until the Lead closes the round.
        </Text>
      ) : null}
    </View>
  );
}

/** − n + with the reason a button is off in its label; Arrow keys work through the buttons on a keyboard. */
function Stepper({
  label,
  value,
  min,
  max,
  onChange,
  colour,
  testID,
}: {
  label: string;
  value: number;
  min: number;
  max: number;
  onChange: (n: number) => void;
  colour?: string;
  testID: string;
}) {
  return (
    <View style={styles.stepper} testID={testID}>
      {colour ? <View style={[styles.dot, { backgroundColor: colour }]} /> : null}
      <Text size="small" style={styles.stepLabel} numberOfLines={2}>
        {label}
      </Text>
      <Button
        label="−"
        accessibilityLabel={`One fewer for ${label}`}
        variant="secondary"
        small
        disabled={value <= min}
        onPress={() => onChange(Math.max(min, value - 1))}
        testID={`${testID}-less`}
      />
      <Text
        mono
        weight="medium"
        style={styles.stepValue}
        accessibilityLabel={`${label}: ${value}`}
        aria-live="polite"
        testID={`${testID}-value`}
      >
        {value}
      </Text>
      <Button
        label="+"
        accessibilityLabel={`One more for ${label}`}
        variant="secondary"
        small
        disabled={value >= max}
        onPress={() => onChange(Math.min(max, value + 1))}
        testID={`${testID}-more`}
      />
    </View>
  );
}

function ClosedRound({ round, candidates }: { round: Round; candidates: Named[] }) {
  return (
    <View style={styles.section} testID="round-closed-panel">
      <Heading level={3}>Preference round {round.number} · closed</Heading>
      <Text size="small" tone="soft">
        {count(round.voters, 'person', 'people')} voted · {count(round.votesPerPerson, 'vote', 'votes')} each
        {round.closedAt ? ` · closed ${formatDateTime(round.closedAt)}` : ''}
      </Text>
      <Tally round={round} candidates={candidates} />
    </View>
  );
}

/** Votes per candidate as bars in the candidate's colour, most first; the count is always written. */
function Tally({ round, candidates }: { round: Round; candidates: Named[] }) {
  const t = useTheme();
  if (!round.tally) return null;
  const tally = round.tally;
  const top = Math.max(1, ...Object.values(tally));
  const rows = candidates
    .map((c) => ({ ...c, votes: tally[c.id] ?? 0 }))
    .sort((a, b) => b.votes - a.votes || a.name.localeCompare(b.name));
  return (
    <View style={styles.tally} testID={`tally-round-${round.number}`}>
      {rows.map((r) => (
        <View key={r.id} style={styles.tallyRow} testID={`tally-row-${r.id}`}>
          <Text size="small" numberOfLines={1} style={styles.tallyName}>
            {r.name}
          </Text>
          <View style={[styles.track, { backgroundColor: t.surfaceSunk }]}>
            <View style={[styles.bar, { width: `${(r.votes / top) * 100}%`, backgroundColor: r.colour }]} />
          </View>
          <Text size="small" mono style={styles.tallyCount} testID={`tally-count-${r.id}`}>
            {r.votes}
          </Text>
        </View>
      ))}
    </View>
  );
}

function EarlierRounds({ rounds, candidates }: { rounds: Round[]; candidates: Named[] }) {
  const [open, setOpen] = useState(false);
  return (
    <View style={styles.section}>
      <Button
        label={open ? 'Hide earlier rounds' : `Earlier rounds (${rounds.length})`}
        variant="quiet"
        small
        style={styles.left}
        onPress={() => setOpen((o) => !o)}
        testID="rounds-earlier"
      />
      {open ? rounds.map((r) => <ClosedRound key={r.id} round={r} candidates={candidates} />) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  panel: { gap: space[2] },
  section: { gap: space[1] },
  ballot: { gap: space[1] },
  stepper: { flexDirection: 'row', alignItems: 'center', gap: space[1] },
  dot: { width: 10, height: 10, borderRadius: 5 },
  stepLabel: { flex: 1, minWidth: 0 },
  stepValue: { minWidth: 28, textAlign: 'center' },
  tally: { gap: space.half },
  tallyRow: { flexDirection: 'row', alignItems: 'center', gap: space[1] },
  tallyName: { width: 120 },
  track: { flex: 1, height: 10, borderRadius: radius.pill, overflow: 'hidden' },
  bar: { height: 10, borderRadius: radius.pill },
  tallyCount: { minWidth: 24, textAlign: 'right' },
  left: { alignSelf: 'flex-start' },
});
