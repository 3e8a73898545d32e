import { apiErrorFromBody, networkError } from './api-error';
import { apiOrigin } from './origin';

type Method = 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';

/**
 * The JSON API helper: same-origin cookies, JSON in and out (or a multipart FormData in, its
 * boundary set by fetch), and one error type thrown for every failure (see api-error.ts).
 */
async function request<T>(method: Method, path: string, body?: unknown, signal?: AbortSignal): Promise<T> {
  const json = body !== undefined && !(typeof FormData !== 'undefined' && body instanceof FormData);
  let response: Response;
  try {
    response = await fetch(apiOrigin() + path, {
      method,
      credentials: 'include',
      headers: json
        ? { accept: 'application/json', 'content-type': 'application/json' }
        : { accept: 'application/json' },
      body: json ? JSON.stringify(body) : (body as FormData | undefined),
      signal,
    });
  } catch (error) {
    if ((error as Error)?.name === 'AbortError') throw error;
    throw networkError();
  }
  const text = await response.text();
  let parsed: unknown = null;
  if (text) {
    try {
      parsed = JSON.parse(text);
    } catch {
      parsed = null;
    }
  }
  if (!response.ok) throw apiErrorFromBody(response.status, parsed);
  return parsed as T;
}

export const api = {
  get: <T>(path: string, signal?: AbortSignal) => request<T>('GET', path, undefined, signal),
  post: <T>(path: string, body: unknown) => request<T>('POST', path, body),
  put: <T>(path: string, body: unknown) => request<T>('PUT', path, body),
  putForm: <T>(path: string, form: FormData) => request<T>('PUT', path, form),
  patch: <T>(path: string, body: unknown) => request<T>('PATCH', path, body),
  delete: <T>(path: string) => request<T>('DELETE', path),
};
