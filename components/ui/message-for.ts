import { isApiError } from '@/components/data/api-error';

/** The one place that turns any failure into a sentence for the screen. */
export function messageFor(error: unknown): string {
  if (isApiError(error)) return error.message;
  if (error instanceof TypeError) return 'Cannot reach the Cyclemoot server. Check your connection and try again.';
  if (error instanceof Error && error.message) return error.message;
  return 'Something went wrong. Try again.';
}
