import { isApiError, networkError } from '@/components/data/api-error';

/** The one place that turns any failure into a sentence for the screen. */
export function messageFor(error: unknown): string {
  if (isApiError(error)) return error.message;
  // fetch rejects with a TypeError when the server cannot be reached.
  if (error instanceof TypeError) return networkError().message;
  if (error instanceof Error && error.message) return error.message;
  return 'Something went wrong. Try again.';
}
