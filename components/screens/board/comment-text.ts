/**
 * The @ being typed at `cursor`: where it starts and the text after it, or null when the
 * cursor is not in one. An @ counts at the start or after a space, and the name typed so
 * far may hold single spaces (members are named in full, "@Ines Moreau").
 */
export function mentionQueryAt(body: string, cursor: number): { start: number; text: string } | null {
  const before = body.slice(0, cursor);
  const at = before.lastIndexOf('@');
  if (at === -1) return null;
  if (at > 0 && !/\s/.test(before[at - 1]!)) return null;
  const text = before.slice(at + 1);
  if (text.length > 60 || /\n|\s{2}|^\s/.test(text)) return null;
  return { start: at, text };
}

/** An id for one comment, made by the client so a retried post is stored once. */
export function newClientId(): string {
  const c = (globalThis as { crypto?: { randomUUID?: () => string } }).crypto;
  if (c?.randomUUID) return c.randomUUID();
  return `c${Date.now().toString(36)}${Math.random().toString(36).slice(2, 12)}`;
}
