import Constants from 'expo-constants';

/** Native builds talk to the server named in app.json `extra.apiOrigin`. */
export function apiOrigin(): string {
  const extra = Constants.expoConfig?.extra as { apiOrigin?: string } | undefined;
  return extra?.apiOrigin ?? 'http://127.0.0.1:8090';
}
