import type { z } from 'zod';

import { mapError } from '@/server/http/error-mapper';

import type { Ack, AckError } from '../events';

/**
 * Wraps a socket handler: parse the payload, run access and the service, answer the ack
 * with `{ ok: true }` or the error the HTTP routes would give.
 */
export function handle<P>(schema: z.ZodType<P>, run: (payload: P) => Promise<void>) {
  return async (raw: unknown, ack?: Ack) => {
    const reply: Ack = typeof ack === 'function' ? ack : () => {};
    const parsed = schema.safeParse(raw);
    if (!parsed.success) {
      reply({ error: { code: 'invalid_input', message: parsed.error.issues[0]?.message ?? 'Invalid payload.' } });
      return;
    }
    try {
      await run(parsed.data);
      reply({ ok: true });
    } catch (error) {
      reply(failure(error));
    }
  };
}

/** An ack's error, from the same mapper as the HTTP responses. */
export function failure(error: unknown): AckError {
  const mapped = mapError(error);
  if (mapped.log === 'unexpected') console.error('[realtime] handler failed:', error);
  const { code, message, field } = mapped.body;
  return { error: field ? { code, message, field } : { code, message } };
}
