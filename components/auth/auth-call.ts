import { apiErrorFromAuth } from '@/components/data/api-error';

type AuthResult<T> = {
  data: T | null;
  error: { code?: string; message?: string; status: number; statusText?: string } | null;
};

/**
 * Unwraps a better-auth client call: returns data, or throws our ApiError so auth
 * failures are presented like every other API failure. `field` names the form field a
 * failure belongs to when the code says so (e.g. a taken e-mail).
 */
export async function authCall<T>(
  call: Promise<AuthResult<T>>,
  fieldFor?: (code: string) => string | undefined,
): Promise<T> {
  const result = await call;
  if (result.error) {
    const code = (result.error.code ?? '').toUpperCase();
    throw apiErrorFromAuth(result.error, fieldFor?.(code));
  }
  return result.data as T;
}

/** better-auth error codes that belong to a field of the sign-in / sign-up forms. */
export function credentialField(code: string): string | undefined {
  if (code.includes('EMAIL')) return 'email';
  if (code.includes('PASSWORD')) return 'password';
  if (code.includes('NAME')) return 'name';
  return undefined;
}
