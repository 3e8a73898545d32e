/** The web app is served by the API server itself: every request is same-origin. */
export function apiOrigin(): string {
  return globalThis.location?.origin ?? '';
}
