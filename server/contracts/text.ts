import { z } from 'zod';

// Postgres refuses NUL in text, and a lone UTF-16 surrogate cannot be encoded as UTF-8:
// both turned into 500s. Other control characters are invisible on screen and in exports.
// eslint-disable-next-line no-control-regex -- finding control characters is the point
const controlInLine = /[\u0000-\u001F\u007F]/;
// eslint-disable-next-line no-control-regex -- likewise, tab and line breaks allowed
const controlInBlock = /[\u0000-\u0008\u000B\u000C\u000E-\u001F\u007F]/;
const loneSurrogate = /[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/;

export type PlainTextRule = {
  /** What the field is called on screen: "Name", "Team name". */
  label: string;
  min?: number;
  max: number;
  /** Allows line breaks and tabs (summaries, comments). */
  multiline?: boolean;
};

/**
 * The one schema for product text a person types: trimmed, within its length, and free of
 * characters the database or the screen cannot hold. Messages name the field.
 */
export function plainText({ label, min = 0, max, multiline = false }: PlainTextRule) {
  const control = multiline ? controlInBlock : controlInLine;
  const tooShort = min === 1 ? `Enter ${label.toLowerCase()}.` : `${label} needs at least ${min} characters.`;
  return z
    .string({ error: `${label} must be text.` })
    .refine((v) => !loneSurrogate.test(v), `${label} contains a broken character; retype it.`)
    .refine((v) => !control.test(v), `${label} must not contain control characters.`)
    .transform((v) => v.trim())
    .pipe(z.string().min(min, tooShort).max(max, `${label} must be at most ${max} characters.`));
}
