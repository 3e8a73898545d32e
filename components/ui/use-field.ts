import { useCallback, useState } from 'react';
import type { FieldPath, FieldValues, UseFormSetError } from 'react-hook-form';

import { isApiError } from '@/components/data/api-error';

import { messageFor } from './message-for';

type Schema = {
  safeParse(
    value: unknown,
  ): { success: true; data: unknown } | { success: false; error: { issues: Array<{ message: string }> } };
};

/**
 * One form field checked against the same zod schema the server uses: the message appears
 * as the user types (after the first change) and again on submit; a server field error
 * set with `setServerError` shows until the value changes.
 */
export function useField(schema: Schema, initial = '') {
  const [value, setRaw] = useState(initial);
  const [touched, setTouched] = useState(false);
  const [serverError, setServerError] = useState<string | null>(null);

  const check = useCallback(
    (v: string): string | null => {
      const result = schema.safeParse(v);
      return result.success ? null : (result.error.issues[0]?.message ?? 'This value is not valid.');
    },
    [schema],
  );

  const setValue = useCallback((v: string) => {
    setRaw(v);
    setTouched(true);
    setServerError(null);
  }, []);

  const localError = touched ? check(value) : null;

  /** Marks the field touched; true when it is valid. */
  const validate = useCallback(() => {
    setTouched(true);
    return check(value) === null;
  }, [check, value]);

  const reset = useCallback((v = '') => {
    setRaw(v);
    setTouched(false);
    setServerError(null);
  }, []);

  return { value, setValue, error: localError ?? serverError, validate, reset, setServerError };
}

type FormField = Pick<ReturnType<typeof useField>, 'setServerError'>;

/** The server's message for each of `names` it addressed (in `fieldErrors`, or by `field`). */
function serverFieldErrors(error: unknown, names: readonly string[]): Array<[string, string]> {
  if (!isApiError(error)) return [];
  return names.flatMap((name): Array<[string, string]> => {
    const message = error.fieldError(name);
    return message ? [[name, message]] : [];
  });
}

/**
 * The one way a form shows a failed submit: each message the server addressed to one of
 * `fields` (in `fieldErrors`, or by `field`) shows at that field. Answers the line for the
 * whole form when the failure named none of them, else null.
 */
export function showFieldErrors(error: unknown, fields: Record<string, FormField>): string | null {
  const atFields = serverFieldErrors(error, Object.keys(fields));
  for (const [name, message] of atFields) fields[name]!.setServerError(message);
  return atFields.length > 0 ? null : messageFor(error);
}

/** Where `setServerErrors` puts a failure that named none of the form's fields. */
export const formErrorKey = 'root.server' as const;

/**
 * The same for a react-hook-form form: each server message for one of `names` is set on
 * that field with `setError` (the first one takes the focus), so it shows at the field and
 * clears when the value changes and validates again; a failure that named none of them
 * becomes the form's line at `errors.root.server`.
 */
export function setServerErrors<TValues extends FieldValues>(
  error: unknown,
  setError: UseFormSetError<TValues>,
  names: ReadonlyArray<FieldPath<TValues>>,
): void {
  const atFields = serverFieldErrors(error, names);
  atFields.forEach(([name, message], i) =>
    setError(name as FieldPath<TValues>, { type: 'server', message }, { shouldFocus: i === 0 }),
  );
  if (atFields.length === 0) setError(formErrorKey, { type: 'server', message: messageFor(error) });
}
