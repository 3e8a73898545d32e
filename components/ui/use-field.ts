import { useCallback, useState } from 'react';

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

/**
 * The one way a form shows a failed submit: each message the server addressed to one of
 * `fields` (in `fieldErrors`, or by `field`) shows at that field. Answers the line for the
 * whole form when the failure named none of them, else null.
 */
export function showFieldErrors(error: unknown, fields: Record<string, FormField>): string | null {
  let atAField = false;
  if (isApiError(error)) {
    for (const [key, field] of Object.entries(fields)) {
      const message = error.fieldError(key);
      if (message) {
        field.setServerError(message);
        atAField = true;
      }
    }
  }
  return atAField ? null : messageFor(error);
}
