import type { Formatted } from '@/components/ui/format';

/** A file's size in B, kB, MB (powers of 1024, as the 20 MB limit is counted). */
export function fileSize(bytes: number): Formatted {
  if (bytes < 1024) return { value: String(bytes), unit: 'B' };
  if (bytes < 1024 * 1024) return { value: (bytes / 1024).toFixed(bytes < 10 * 1024 ? 1 : 0), unit: 'kB' };
  return { value: (bytes / (1024 * 1024)).toFixed(1), unit: 'MB' };
}

export const showSize = (bytes: number) => {
  const { value, unit } = fileSize(bytes);
  return `${value} ${unit}`;
};
