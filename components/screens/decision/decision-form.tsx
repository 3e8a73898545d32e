import { zodResolver } from '@hookform/resolvers/zod';
import { useEffect, useRef, useState, type ReactNode } from 'react';
import { Controller, useFieldArray, useForm, useWatch, type Control } from 'react-hook-form';
import { StyleSheet, View } from 'react-native';

import { useSignDecisionMutation, useUpdateDecisionMutation } from '@/components/data/decision';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { Choice, FormError, FormField } from '@/components/ui/field';
import { Heading, Text } from '@/components/ui/text';
import { useTheme } from '@/components/ui/theme';
import { space } from '@/components/ui/tokens';
import { setServerErrors } from '@/components/ui/use-field';
import type { CandidateWire } from '@/server/contracts/board';
import { updateDecisionInput, type DecisionRevision, type UpdateDecisionInput } from '@/server/contracts/decision';

type Values = {
  chosenCandidateId: string | null;
  rationale: string;
  assumptions: string;
  rejected: Array<{ candidateId: string; reason: string }>;
  dissent: Array<{ name: string; text: string }>;
  actions: Array<{ text: string; owner: string; due: string }>;
};

const valuesOf = (r: DecisionRevision): Values => ({
  chosenCandidateId: r.chosenCandidateId,
  rationale: r.rationale,
  assumptions: r.assumptions,
  rejected: r.rejected.map((x) => ({ ...x })),
  dissent: r.dissent.map((x) => ({ ...x })),
  actions: r.actions.map((x) => ({ ...x })),
});

/** The values as the server stores them: every text trimmed. */
function trimmed(v: unknown): unknown {
  if (typeof v === 'string') return v.trim();
  if (Array.isArray(v)) return v.map(trimmed);
  if (v && typeof v === 'object') return Object.fromEntries(Object.entries(v).map(([k, x]) => [k, trimmed(x)]));
  return v;
}
const sameText = (a: Values, b: Values) => JSON.stringify(trimmed(a)) === JSON.stringify(trimmed(b));

const fieldNames = ['chosenCandidateId', 'rationale', 'assumptions', 'rejected', 'dissent', 'actions'] as const;

/** How long typing may pause before the draft is saved by itself. */
const autosaveMs = 900;

/**
 * The open draft: chosen candidate, rationale, assumptions, rejected alternatives with a
 * reason each, dissent, actions with owner and due date. Checked with the route's own schema
 * as you type; saved to the server by itself a moment after a valid change (and with Save),
 * so a reload loses nothing. Someone else's saved change replaces the form while it is clean.
 */
export function DecisionForm({
  reviewId,
  draft,
  candidates,
  onSaved,
}: {
  reviewId: string;
  draft: DecisionRevision;
  candidates: CandidateWire[];
  onSaved?: () => void;
}) {
  const t = useTheme();
  const save = useUpdateDecisionMutation(reviewId);
  const sign = useSignDecisionMutation(reviewId);
  const [confirming, setConfirming] = useState(false);
  const { control, handleSubmit, setError, formState, reset, getValues } = useForm<
    Values,
    unknown,
    UpdateDecisionInput
  >({
    resolver: zodResolver(updateDecisionInput) as never,
    mode: 'onChange',
    defaultValues: valuesOf(draft),
  });
  const { isDirty, isValid, isSubmitting } = formState;

  // A change saved by someone else (or our own, back from the server) arrives as a newer
  // revision: the form takes it while it holds nothing unsaved.
  const seen = useRef(draft.updatedAt);
  useEffect(() => {
    if (draft.updatedAt === seen.current) return;
    seen.current = draft.updatedAt;
    // Our own save coming back differs only by the trimming: keep what is typed (a trailing space).
    if (!isDirty && !sameText(valuesOf(draft), getValues())) reset(valuesOf(draft));
  }, [draft, isDirty, reset, getValues]);

  const submit = handleSubmit(async (input) => {
    try {
      await save.mutateAsync(input);
      // What was sent is what is stored; keep what was typed since.
      reset(getValues(), { keepValues: true });
      onSaved?.();
    } catch (error) {
      setServerErrors(error, setError, [...fieldNames]);
    }
  });
  const submitRef = useRef(submit);
  useEffect(() => {
    submitRef.current = submit;
  });

  const watched = useWatch({ control });
  useEffect(() => {
    if (!isDirty || !isValid) return;
    const timer = setTimeout(() => void submitRef.current(), autosaveMs);
    return () => clearTimeout(timer);
  }, [watched, isDirty, isValid]);

  /** Saves what is typed first, then signs; a refusal (no chosen candidate, no rationale) shows at its field. */
  const signNow = async () => {
    if (isDirty) {
      await submit();
      if (!isValidNow()) return;
    }
    try {
      await sign.mutateAsync();
      setConfirming(false);
    } catch (error) {
      setConfirming(false);
      setServerErrors(error, setError, [...fieldNames]);
    }
  };
  const isValidNow = () => updateDecisionInput.safeParse(getValues()).success;

  const status = isSubmitting
    ? 'Saving…'
    : !isValid
      ? 'Not saved: correct the marked fields.'
      : isDirty
        ? 'Unsaved changes…'
        : 'All changes saved.';

  return (
    <Card style={styles.card} testID="decision-form">
      <View style={styles.head}>
        <Heading level={2}>Revision {draft.number} · Draft</Heading>
        <Text size="small" tone={isValid ? 'muted' : 'danger'} testID="decision-save-state" aria-live="polite">
          {status}
        </Text>
      </View>
      <Controller
        control={control}
        name="chosenCandidateId"
        render={({ field, fieldState }) => (
          <Choice
            label="Chosen candidate"
            options={candidates.map((c) => ({ value: c.id, label: c.name }))}
            value={field.value ?? ''}
            onChange={field.onChange}
            error={fieldState.error?.message}
            testID="decision-chosen"
          />
        )}
      />
      <FormField
        control={control}
        name="rationale"
        label="Rationale"
        placeholder="Why this candidate, in the words the basis-of-design document will carry."
        multiline
        numberOfLines={5}
        testID="decision-rationale"
      />
      <FormField
        control={control}
        name="assumptions"
        label="Assumptions"
        placeholder="What the choice takes as given: fuel, site, limits, data still to come."
        multiline
        numberOfLines={3}
        testID="decision-assumptions"
      />
      <Rejected control={control} candidates={candidates} />
      <Dissent control={control} />
      <Actions control={control} />
      <FormError message={formState.errors.root?.server?.message} testID="decision-form-error" />
      {confirming ? (
        <View
          style={[styles.confirm, { borderColor: t.warning }]}
          testID="decision-sign-confirm"
          role="alertdialog"
          aria-label="Sign the decision record"
        >
          <Text weight="semibold">Sign revision {draft.number}?</Text>
          <Text size="small" tone="soft">
            Once signed it is read-only, with your name, the time and the figures of the board as they are now. Every
            member is told by e-mail. Changing it later means reopening it as revision {draft.number + 1}.
          </Text>
          <View style={styles.row}>
            <Button label="Cancel" variant="quiet" onPress={() => setConfirming(false)} testID="decision-sign-cancel" />
            <Button
              label={`Sign revision ${draft.number}`}
              busy={sign.isPending}
              onPress={() => void signNow()}
              testID="decision-sign-confirm-button"
            />
          </View>
        </View>
      ) : null}
      <View style={styles.row}>
        <Button
          label="Save draft"
          variant="secondary"
          busy={isSubmitting}
          disabled={!isDirty}
          onPress={() => void submit()}
          testID="decision-save"
        />
        {!confirming ? <Button label="Sign…" onPress={() => setConfirming(true)} testID="decision-sign" /> : null}
      </View>
    </Card>
  );
}

/** One entry of a list, set in by a hairline on its left. */
function Entry({ children, testID }: { children: ReactNode; testID: string }) {
  const t = useTheme();
  return (
    <View style={[styles.entry, { borderLeftColor: t.hairline }]} testID={testID}>
      {children}
    </View>
  );
}

function ListHead({ title, hint }: { title: string; hint: string }) {
  return (
    <View style={styles.listHead}>
      <Text weight="semibold">{title}</Text>
      <Text size="small" tone="muted">
        {hint}
      </Text>
    </View>
  );
}

function Rejected({
  control,
  candidates,
}: {
  control: Control<Values, unknown, UpdateDecisionInput>;
  candidates: CandidateWire[];
}) {
  const { fields, append, remove } = useFieldArray({ control, name: 'rejected' });
  const chosen = useWatch({ control, name: 'chosenCandidateId' });
  const listed = useWatch({ control, name: 'rejected' }) ?? [];
  const free = candidates.filter((c) => c.id !== chosen && !listed.some((r) => r?.candidateId === c.id));
  return (
    <View style={styles.list} testID="decision-rejected">
      <ListHead title="Rejected alternatives" hint="Each with the reason it was set aside." />
      {fields.map((f, i) => (
        <Entry key={f.id} testID={`decision-rejected-${i}`}>
          <Text weight="medium">{candidates.find((c) => c.id === listed[i]?.candidateId)?.name ?? 'A candidate'}</Text>
          <FormField
            control={control}
            name={`rejected.${i}.reason`}
            label="Reason"
            multiline
            numberOfLines={2}
            testID={`decision-rejected-${i}-reason`}
          />
          <Button
            label="Remove"
            variant="quiet"
            small
            onPress={() => remove(i)}
            testID={`decision-rejected-${i}-remove`}
          />
        </Entry>
      ))}
      {free.length > 0 ? (
        <View style={styles.row}>
          {free.map((c) => (
            <Button
              key={c.id}
              label={`+ Reject ${c.name}`}
              variant="secondary"
              small
              onPress={() => append({ candidateId: c.id, reason: '' })}
              testID={`decision-reject-${c.id}`}
            />
          ))}
        </View>
      ) : null}
    </View>
  );
}

function Dissent({ control }: { control: Control<Values, unknown, UpdateDecisionInput> }) {
  const { fields, append, remove } = useFieldArray({ control, name: 'dissent' });
  return (
    <View style={styles.list} testID="decision-dissent">
      <ListHead title="Recorded dissent" hint="Who disagreed, and what they said." />
      {fields.map((f, i) => (
        <Entry key={f.id} testID={`decision-dissent-${i}`}>
          <FormField control={control} name={`dissent.${i}.name`} label="Who" testID={`decision-dissent-${i}-name`} />
          <FormField
            control={control}
            name={`dissent.${i}.text`}
            label="Dissent"
            multiline
            numberOfLines={2}
            testID={`decision-dissent-${i}-text`}
          />
          <Button
            label="Remove"
            variant="quiet"
            small
            onPress={() => remove(i)}
            testID={`decision-dissent-${i}-remove`}
          />
        </Entry>
      ))}
      <View style={styles.row}>
        <Button
          label="+ Add dissent"
          variant="secondary"
          small
          onPress={() => append({ name: '', text: '' })}
          testID="decision-add-dissent"
        />
      </View>
    </View>
  );
}

function Actions({ control }: { control: Control<Values, unknown, UpdateDecisionInput> }) {
  const { fields, append, remove } = useFieldArray({ control, name: 'actions' });
  return (
    <View style={styles.list} testID="decision-actions">
      <ListHead title="Open actions" hint="What is still to do, who owns it, and by when (YYYY-MM-DD)." />
      {fields.map((f, i) => (
        <Entry key={f.id} testID={`decision-action-${i}`}>
          <FormField control={control} name={`actions.${i}.text`} label="Action" testID={`decision-action-${i}-text`} />
          <View style={styles.pair}>
            <View style={styles.half}>
              <FormField
                control={control}
                name={`actions.${i}.owner`}
                label="Owner"
                testID={`decision-action-${i}-owner`}
              />
            </View>
            <View style={styles.half}>
              <FormField
                control={control}
                name={`actions.${i}.due`}
                label="Due date"
                placeholder="YYYY-MM-DD"
                inputMode="numeric"
                maxLength={10}
                testID={`decision-action-${i}-due`}
              />
            </View>
          </View>
          <Button
            label="Remove"
            variant="quiet"
            small
            onPress={() => remove(i)}
            testID={`decision-action-${i}-remove`}
          />
        </Entry>
      ))}
      <View style={styles.row}>
        <Button
          label="+ Add action"
          variant="secondary"
          small
          onPress={() => append({ text: '', owner: '', due: '' })}
          testID="decision-add-action"
        />
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  card: { gap: space[2] },
  head: { gap: space.half },
  row: { flexDirection: 'row', flexWrap: 'wrap', gap: space[1] },
  list: { gap: space[1] },
  listHead: { gap: 2 },
  entry: { gap: space[1], paddingLeft: space[1] + space.half, borderLeftWidth: 2 },
  pair: { flexDirection: 'row', flexWrap: 'wrap', gap: space[1] },
  half: { flexGrow: 1, flexBasis: 160 },
  confirm: { gap: space[1], padding: space[2], borderWidth: 1, borderRadius: 12 },
});
