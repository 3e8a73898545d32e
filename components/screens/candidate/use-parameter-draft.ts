import { zodResolver } from '@hookform/resolvers/zod';
import { useQueryClient } from '@tanstack/react-query';
import { useCallback, useEffect, useMemo, useRef, useState } from 'react';
import { useForm, useWatch, type FieldPath } from 'react-hook-form';

import { isApiError, type ApiError } from '@/components/data/api-error';
import { boardKeys, useEvaluateQuery, useUpdateCandidateMutation, type CycleResultWire } from '@/components/data/board';
import type { UnitSystem } from '@/components/ui/format';
import { messageFor } from '@/components/ui/message-for';
import type { Board, CandidateParameters, CandidateWire } from '@/server/contracts/board';

import {
  changedNames,
  changedPart,
  formFieldName,
  parameterFormSchema,
  toFormValues,
  type ParameterFormValues,
} from './parameter-model';

/** Waits `ms` after the last change of `value` before passing it on. */
export function useDebounced<T>(value: T, ms: number): T {
  const [settled, setSettled] = useState(value);
  useEffect(() => {
    const timer = setTimeout(() => setSettled(value), ms);
    return () => clearTimeout(timer);
  }, [value, ms]);
  return settled;
}

export type FieldMessage = { field: string; message: string };

/** The engine's (or the route's) message and the form field it names, from a 422. */
export function engineFieldError(error: unknown): FieldMessage | null {
  if (!isApiError(error) || error.status !== 422) return null;
  const field = error.field ?? Object.keys(error.fieldErrors)[0];
  const message = (field && error.fieldErrors[field]?.[0]) ?? error.message;
  return { field: formFieldName(field) ?? '', message };
}

export type Conflict = {
  /** The candidate as it is now on the server. */
  theirs: CandidateWire;
  /** My texts, kept so I can apply them again. */
  mine: ParameterFormValues;
  /** The fields I had changed. */
  names: string[];
};

export const previewDelayMs = 300;

/**
 * The candidate's parameter form and everything around it: the draft checked with the
 * server's schema as you type, a preview of the unsaved values from the engine (after
 * `previewDelayMs` of quiet), saving the changed part with the revision it was made on, and
 * the conflict when someone saved first.
 */
export function useParameterDraft(reviewId: string, candidate: CandidateWire, system: UnitSystem) {
  const qc = useQueryClient();
  const update = useUpdateCandidateMutation(reviewId, candidate.id);
  const schema = useMemo(() => parameterFormSchema(system), [system]);
  const saved = useMemo(() => toFormValues(candidate.parameters, system), [candidate.parameters, system]);
  const form = useForm<ParameterFormValues, unknown, CandidateParameters>({
    resolver: zodResolver(schema),
    mode: 'onChange',
    defaultValues: saved,
  });

  // The saved state the draft was made on: its texts, its revision and its parameters.
  const [base, setBase] = useState(() => ({
    values: saved,
    revision: candidate.revision,
    parameters: JSON.stringify(candidate.parameters),
  }));
  const [conflict, setConflict] = useState<Conflict | null>(null);
  const [saveError, setSaveError] = useState<string | null>(null);

  const values = useWatch({ control: form.control }) as ParameterFormValues;
  const dirty = changedNames(base.values, values).length > 0;

  const restart = useCallback(
    (c: CandidateWire) => {
      const v = toFormValues(c.parameters, system);
      setBase({ values: v, revision: c.revision, parameters: JSON.stringify(c.parameters) });
      form.reset(v);
      setConflict(null);
      setSaveError(null);
    },
    [form, system],
  );

  // Someone else's change (or a recompute after the basis changed) arrives through the cache:
  // a clean form takes it; a draft keeps its texts, and moves its base on when the
  // parameters it was made on are still the saved ones.
  const lastSystem = useRef(system);
  useEffect(() => {
    const unitsChanged = lastSystem.current !== system;
    lastSystem.current = system;
    if (candidate.revision === base.revision && !unitsChanged) return;
    const isDirty = changedNames(base.values, form.getValues()).length > 0;
    // The form is reset from outside data (the cache), which is what an effect is for here.
    if (!isDirty || unitsChanged) restart(candidate);
    else if (JSON.stringify(candidate.parameters) === base.parameters)
      // eslint-disable-next-line react-hooks/set-state-in-effect
      setBase((b) => ({ ...b, revision: candidate.revision }));
  }, [candidate, system, form, restart, base]);

  // The preview: the whole engine input of the candidate with the draft's parameters.
  const settled = useDebounced(values, previewDelayMs);
  const settledDirty = changedNames(base.values, settled).length > 0;
  const parsed = schema.safeParse(settled);
  const previewInput = useMemo(
    () => (settledDirty && parsed.success ? { ...candidate.input, ...parsed.data } : null),
    // parsed.data is new each render; its JSON is what matters.
    // eslint-disable-next-line react-hooks/exhaustive-deps
    [settledDirty, parsed.success && JSON.stringify(parsed.data), candidate.input],
  );
  const preview = useEvaluateQuery(previewInput);
  const typing = settled !== values;
  const previewResult: CycleResultWire | null =
    dirty && previewInput && preview.data && !preview.isPlaceholderData ? preview.data : null;
  const previewError = dirty && previewInput && !preview.isFetching ? engineFieldError(preview.error) : null;
  const previewOther =
    dirty && previewInput && preview.error && !engineFieldError(preview.error) ? messageFor(preview.error) : null;

  /** The message to show at a field beside the schema's: the preview's, else the stored refusal. */
  const engineErrorAt = (name: string): string | undefined => {
    if (dirty) return previewError?.field === name ? previewError.message : undefined;
    const stored = candidate.error;
    return stored && formFieldName(stored.field) === name ? stored.message : undefined;
  };

  const send = async (
    ifRevision: number,
    baseValues: ParameterFormValues,
    current: ParameterFormValues,
    next: CandidateParameters,
  ) => {
    const parameters = changedPart(baseValues, current, next);
    if (Object.keys(parameters).length === 0) return null;
    setSaveError(null);
    try {
      const updated = await update.mutateAsync({ parameters, ifRevision });
      restart(updated);
      return updated;
    } catch (error) {
      if (isApiError(error) && error.status === 409) {
        // The answer names the candidate as it is now; the board holds the same after a refetch.
        await qc.invalidateQueries({ queryKey: boardKeys.board(reviewId) });
        const theirs =
          qc.getQueryData<Board>(boardKeys.board(reviewId))?.candidates.find((c) => c.id === candidate.id) ?? candidate;
        setConflict({ theirs, mine: current, names: changedNames(baseValues, current) });
        return null;
      }
      const atField = engineFieldError(error);
      if (atField && atField.field) {
        form.setError(atField.field as FieldPath<ParameterFormValues>, { type: 'server', message: atField.message });
      } else {
        setSaveError(messageFor(error as ApiError));
      }
      return null;
    }
  };

  const save = form.handleSubmit(async (next) => {
    await send(base.revision, base.values, form.getValues(), next);
  });

  /** After a conflict: my texts again, on top of their revision. */
  const applyMine = async () => {
    if (!conflict) return;
    const mine = schema.safeParse(conflict.mine);
    if (!mine.success) return;
    // Only the fields I changed are sent, so theirs stay where I did not type.
    await send(conflict.theirs.revision, base.values, conflict.mine, mine.data);
  };

  const takeTheirs = () => {
    if (conflict) restart(conflict.theirs);
  };

  const discard = () => restart(candidate);

  return {
    form,
    values,
    dirty,
    typing,
    saving: form.formState.isSubmitting || update.isPending,
    save,
    discard,
    conflict,
    applyMine,
    takeTheirs,
    saveError,
    engineErrorAt,
    theirsValues: (c: CandidateWire) => toFormValues(c.parameters, system),
    preview: {
      result: previewResult,
      error: previewError,
      other: previewOther,
      pending: dirty && (typing || preview.isFetching),
      invalid: dirty && !parsed.success,
    },
  };
}

export type ParameterDraft = ReturnType<typeof useParameterDraft>;
