import { apiErrorFromAuth } from '@/components/data/api-error';

type AuthResult<T> = {
  data: T | null;
  error: { code?: string; message?: string; status: number; statusText?: string } | null;
};

/** Which form field a better-auth error code belongs to, by its exact code. */
export type AuthFieldCodes = Readonly<Record<string, string>>;

/**
 * Unwraps a better-auth client call: returns data, or throws our ApiError so auth
 * failures are presented like every other API failure. `fields` names the form field a
 * failure belongs to (e.g. a taken e-mail); other codes stay form-level messages.
 */
export async function authCall<T>(call: Promise<AuthResult<T>>, fields?: AuthFieldCodes): Promise<T> {
  const result = await call;
  if (result.error) {
    const code = (result.error.code ?? '').toUpperCase();
    throw apiErrorFromAuth(result.error, fields?.[code]);
  }
  return result.data as T;
}

/** better-auth's codes for the fields of the sign-in / sign-up forms. */
export const credentialFields: AuthFieldCodes = {
  INVALID_EMAIL: 'email',
  USER_ALREADY_EXISTS_USE_ANOTHER_EMAIL: 'email',
  USER_EMAIL_NOT_FOUND: 'email',
  INVALID_EMAIL_OR_PASSWORD: 'email',
  INVALID_PASSWORD: 'password',
  PASSWORD_TOO_SHORT: 'password',
  PASSWORD_TOO_LONG: 'password',
};
