import { useMemo, useState } from 'react';
import { Pressable, StyleSheet, TextInput, View } from 'react-native';

import { isApiError } from '@/components/data/api-error';
import { usePutScoresMutation } from '@/components/data/scores';
import { Button } from '@/components/ui/button';
import { Choice } from '@/components/ui/field';
import { focusRing, type PressState } from '@/components/ui/focus';
import { readLocal, writeLocal } from '@/components/ui/local-store';
import { messageFor } from '@/components/ui/message-for';
import { Text } from '@/components/ui/text';
import { useTheme } from '@/components/ui/theme';
import { fontFamily, radius, space, touchTarget, typeScale } from '@/components/ui/tokens';
import type { Matrix } from '@/server/contracts/matrix';
import { preScoreRule, scoreReason, scoreValue, type Score } from '@/server/contracts/scores';

type Draft = Record<string, { score: string; reason: string }>;

const draftKey = (reviewId: string, candidateId: string) => `cyclemoot:score-draft:${reviewId}:${candidateId}`;

function savedDraft(matrix: Matrix, mine: Score[], candidateId: string): Draft {
  return Object.fromEntries(
    matrix.criteria.map((c) => {
      const s = mine.find((x) => x.candidateId === candidateId && x.criterionId === c.id);
      return [c.id, { score: s ? String(s.score) : '', reason: s?.reason ?? '' }];
    }),
  );
}

/** What a draft line says, checked with the route's own schemas as the person types. */
function checkLine(line: { score: string; reason: string }, preScore: number | null) {
  const text = line.score.trim();
  let score: number | null = null;
  let scoreError: string | null = null;
  if (text !== '') {
    const parsed = scoreValue.safeParse(Number(text));
    if (!/^-?\d+(\.\d+)?$/.test(text)) scoreError = 'Score must be a whole number from 1 to 5.';
    else if (!parsed.success) scoreError = parsed.error.issues[0]!.message;
    else score = parsed.data;
  }
  const reason = scoreReason.safeParse(line.reason);
  let reasonError = reason.success ? null : reason.error.issues[0]!.message;
  if (!reasonError && score !== null && preScore !== null && line.reason.trim() === '') {
    reasonError = `Give a reason to override the pre-score ${preScore.toFixed(2)}.`;
  }
  return { score, scoreError, reasonError, reason: reason.success ? reason.data : line.reason };
}

/**
 * The signed-in person's Scores for one candidate at a time: 1–5 per criterion by the
 * buttons or typed, a one-line reason, checked as typed and saved to the server in one
 * change. A measured criterion shows its pre-score; scoring it is an override and needs a
 * reason. Unsaved lines are kept on this device, so a reload loses nothing.
 */
export function ScoreSheet({
  reviewId,
  matrix,
  mine,
  onClose,
}: {
  reviewId: string;
  matrix: Matrix;
  mine: Score[];
  onClose: () => void;
}) {
  const t = useTheme();
  const [candidateId, setCandidateId] = useState(matrix.candidates[0]!.id);
  const saved = useMemo(() => savedDraft(matrix, mine, candidateId), [matrix, mine, candidateId]);
  /** The saved scores of a candidate, with any unsaved lines kept on this device. */
  const draftOf = (id: string, base: Draft): Draft => {
    const stored = readLocal(draftKey(reviewId, id));
    return stored ? { ...base, ...(JSON.parse(stored) as Draft) } : base;
  };
  const [draft, setDraft] = useState<Draft>(() => draftOf(candidateId, saved));
  const [serverErrors, setServerErrors] = useState<Record<string, string>>({});
  const [done, setDone] = useState<string | null>(null);
  const put = usePutScoresMutation(reviewId);

  const choose = (id: string) => {
    setCandidateId(id);
    setDraft(draftOf(id, savedDraft(matrix, mine, id)));
    setServerErrors({});
    setDone(null);
  };

  const changed = matrix.criteria.filter((c) => {
    const d = draft[c.id];
    const s = saved[c.id];
    return d && s && (d.score.trim() !== s.score || d.reason.trim() !== s.reason);
  });

  const edit = (criterionId: string, part: 'score' | 'reason', value: string) => {
    const next = { ...draft, [criterionId]: { ...draft[criterionId]!, [part]: value } };
    setDraft(next);
    setDone(null);
    setServerErrors((e) => {
      const { [criterionId]: _gone, ...rest } = e;
      return rest;
    });
    writeLocal(draftKey(reviewId, candidateId), JSON.stringify(next));
  };

  const row = (criterionId: string) => matrix.rows.find((r) => r.criterionId === criterionId)!;
  const checks = Object.fromEntries(
    matrix.criteria.map((c) => [
      c.id,
      checkLine(draft[c.id] ?? { score: '', reason: '' }, row(c.id).cells[candidateId]?.preScore ?? null),
    ]),
  );
  const invalid = changed.some((c) => checks[c.id]!.scoreError || checks[c.id]!.reasonError);

  const save = async () => {
    if (changed.length === 0 || invalid || put.isPending) return;
    const entries = changed.map((c) => ({
      candidateId,
      criterionId: c.id,
      score: checks[c.id]!.score,
      reason: checks[c.id]!.reason,
    }));
    try {
      await put.mutateAsync({ scores: entries });
      writeLocal(draftKey(reviewId, candidateId), null);
      setServerErrors({});
      setDone(`Saved ${entries.length === 1 ? '1 score' : `${entries.length} scores`}.`);
    } catch (error) {
      const byCriterion: Record<string, string> = {};
      if (isApiError(error)) {
        for (const [field, messages] of Object.entries(error.fieldErrors)) {
          const m = /^scores\.(\d+)\./.exec(field);
          const entry = m ? entries[Number(m[1])] : undefined;
          if (entry) byCriterion[entry.criterionId] = messages[0] ?? error.message;
        }
      }
      setServerErrors(Object.keys(byCriterion).length > 0 ? byCriterion : { '': messageFor(error) });
    }
  };

  return (
    <View style={[styles.sheet, { borderColor: t.hairline, backgroundColor: t.surfaceRaised }]} testID="score-sheet">
      <View style={[styles.top]}>
        <Text size="title" weight="semibold">
          Your scores
        </Text>
        <Button label="Done" variant="quiet" small onPress={onClose} testID="score-sheet-close" />
      </View>
      <Text size="small" tone="soft">
        1 = worst, 5 = best. Measured criteria are pre-scored from the results ({preScoreRule}); your own score there
        overrides the pre-score and needs a reason.
      </Text>
      <Choice
        label="Candidate"
        options={matrix.candidates.map((c) => ({ value: c.id, label: c.name }))}
        value={candidateId}
        onChange={choose}
        testID="score-candidate"
      />
      {matrix.criteria.map((c) => {
        const d = draft[c.id] ?? { score: '', reason: '' };
        const check = checks[c.id]!;
        const pre = row(c.id).cells[candidateId]?.preScore ?? null;
        const serverError = serverErrors[c.id];
        return (
          <View key={c.id} style={[styles.line, { borderTopColor: t.hairline }]} testID={`score-line-${c.id}`}>
            <View style={styles.lineHead}>
              <Text weight="medium">{c.name}</Text>
              <Text size="caption" tone="muted" mono>
                weight {(row(c.id).share * 100).toFixed(1)} %
                {pre !== null
                  ? ` · pre-score ${pre.toFixed(2)} / 5`
                  : c.measure
                    ? ' · no pre-score (needs two results)'
                    : ''}
              </Text>
            </View>
            <View style={styles.choices} role="radiogroup" accessibilityLabel={`${c.name} score`}>
              {[1, 2, 3, 4, 5].map((n) => {
                const selected = d.score.trim() === String(n);
                return (
                  <Pressable
                    key={n}
                    role="radio"
                    aria-checked={selected}
                    accessibilityState={{ checked: selected }}
                    accessibilityLabel={`${c.name}: ${n} of 5`}
                    onPress={() => edit(c.id, 'score', selected ? '' : String(n))}
                    testID={`score-${c.id}-${n}`}
                    style={({ focused }: PressState) => [
                      styles.choice,
                      {
                        borderColor: selected ? t.accent : t.hairline,
                        backgroundColor: selected ? t.accent : t.surface,
                      },
                      focused && focusRing(t),
                    ]}
                  >
                    <Text mono weight="medium" style={{ color: selected ? t.onAccent : t.text }}>
                      {n}
                    </Text>
                  </Pressable>
                );
              })}
              <TextInput
                value={d.score}
                onChangeText={(v) => edit(c.id, 'score', v)}
                inputMode="numeric"
                keyboardType="number-pad"
                placeholder="1–5"
                placeholderTextColor={t.textMuted}
                accessibilityLabel={`${c.name} score, 1 to 5 (empty withdraws it)`}
                aria-invalid={!!check.scoreError}
                testID={`score-input-${c.id}`}
                onSubmitEditing={save}
                style={[
                  styles.input,
                  styles.scoreInput,
                  { borderColor: check.scoreError ? t.danger : t.hairline, color: t.text, backgroundColor: t.surface },
                ]}
              />
            </View>
            {check.scoreError ? (
              <Text size="small" tone="danger" role="alert" testID={`score-input-${c.id}-error`}>
                {check.scoreError}
              </Text>
            ) : null}
            <TextInput
              value={d.reason}
              onChangeText={(v) => edit(c.id, 'reason', v)}
              placeholder={pre !== null ? 'Reason (needed to override)' : 'Reason (optional, one line)'}
              placeholderTextColor={t.textMuted}
              accessibilityLabel={`${c.name} reason`}
              aria-invalid={!!check.reasonError}
              maxLength={400}
              testID={`score-reason-${c.id}`}
              onSubmitEditing={save}
              style={[
                styles.input,
                { borderColor: check.reasonError ? t.danger : t.hairline, color: t.text, backgroundColor: t.surface },
              ]}
            />
            {check.reasonError || serverError ? (
              <Text size="small" tone="danger" role="alert" testID={`score-reason-${c.id}-error`}>
                {check.reasonError ?? serverError}
              </Text>
            ) : null}
          </View>
        );
      })}
      {serverErrors[''] ? (
        <Text size="small" tone="danger" role="alert" testID="score-sheet-error">
          {serverErrors['']}
        </Text>
      ) : null}
      <View style={styles.top}>
        <Text size="small" tone={done ? 'good' : 'muted'} testID="score-sheet-status" role="status">
          {done ?? (changed.length > 0 ? `${changed.length} unsaved` : 'Nothing to save')}
        </Text>
        <Button
          label="Save scores"
          onPress={save}
          busy={put.isPending}
          disabled={changed.length === 0 || invalid}
          testID="score-save"
        />
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  sheet: { borderWidth: 1, borderRadius: radius.card, padding: space[2], gap: space[2] },
  top: { flexDirection: 'row', alignItems: 'center', justifyContent: 'space-between', gap: space[1], flexWrap: 'wrap' },
  line: { borderTopWidth: 1, paddingTop: space[1], gap: space[1] },
  lineHead: { gap: 2 },
  choices: { flexDirection: 'row', flexWrap: 'wrap', gap: space[1], alignItems: 'center' },
  choice: {
    minHeight: touchTarget,
    minWidth: touchTarget,
    borderRadius: radius.control,
    borderWidth: 1,
    alignItems: 'center',
    justifyContent: 'center',
  },
  input: {
    minHeight: touchTarget,
    borderWidth: 1,
    borderRadius: radius.control,
    paddingHorizontal: space[1] + space.half,
    fontFamily: fontFamily.sans,
    ...typeScale.body,
  },
  scoreInput: { width: 72, fontFamily: fontFamily.mono },
});
