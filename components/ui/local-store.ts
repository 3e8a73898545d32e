/**
 * Small client preferences. Native builds keep them for the life of the process until a
 * storage module is added; the web build uses local-store.web.ts.
 */
const memory = new Map<string, string>();

export function readLocal(key: string): string | null {
  return memory.get(key) ?? null;
}

export function writeLocal(key: string, value: string | null): void {
  if (value === null) memory.delete(key);
  else memory.set(key, value);
}
