import type { z } from 'zod';

/** Field errors keyed by the dotted path of the input, e.g. `turbine.inletTemperatureK`. */
export type FieldErrors = Record<string, string[]>;

/**
 * The one error type a route throws. The error handler turns it into the envelope
 * `{ error: { code, message, field?, fieldErrors?, requestId } }`.
 */
export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly details: { field?: string; fieldErrors?: FieldErrors } = {},
  ) {
    super(message);
    this.name = 'ApiError';
  }

  static unauthorized(message = 'Sign in to continue.') {
    return new ApiError(401, 'unauthorized', message);
  }
  static forbidden(message = 'Your role in this Team does not allow this.') {
    return new ApiError(403, 'forbidden', message);
  }
  static notFound(what = 'The requested item') {
    return new ApiError(404, 'not_found', `${what} was not found.`);
  }
  /** 422 for one named field. */
  static invalidField(field: string, message: string, code = 'invalid_input') {
    return new ApiError(422, code, `${field}: ${message}`, { field, fieldErrors: { [field]: [message] } });
  }
}

/** Dotted path of a zod issue, `''` for the root. */
function issuePath(path: ReadonlyArray<PropertyKey>): string {
  return path.map(String).join('.');
}

/**
 * Validates `input` with `schema`; on failure throws a 422 ApiError whose
 * `fieldErrors` name every failing field and whose `field` is the first of them.
 */
export function parse<S extends z.ZodType>(schema: S, input: unknown): z.output<S> {
  const result = schema.safeParse(input);
  if (result.success) return result.data;
  const fieldErrors: FieldErrors = {};
  for (const issue of result.error.issues) {
    if (issue.code === 'unrecognized_keys') {
      // Name each field that is not accepted, so the envelope points at it.
      for (const extra of issue.keys) {
        (fieldErrors[issuePath([...issue.path, extra])] ??= []).push(`${extra} is not accepted here.`);
      }
      continue;
    }
    const key = issuePath(issue.path) || '(body)';
    (fieldErrors[key] ??= []).push(issue.message);
  }
  const [field, messages] = Object.entries(fieldErrors)[0] ?? ['(body)', ['Invalid input']];
  throw new ApiError(422, 'invalid_input', `${field}: ${messages[0]}`, { field, fieldErrors });
}
