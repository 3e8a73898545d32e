/**
 * Browsers send a file name's UTF-8 bytes as they are; busboy (under multer) reads them as
 * Latin-1. Reads such a name again as UTF-8 when its bytes are valid UTF-8; any other name is
 * kept as it came.
 */
export function uploadedFileName(raw: string): string {
  const codes = [...raw].map((c) => c.codePointAt(0) ?? 0);
  if (!codes.some((c) => c >= 0x80) || codes.some((c) => c > 0xff)) return raw;
  try {
    return new TextDecoder('utf-8', { fatal: true }).decode(Buffer.from(raw, 'latin1'));
  } catch {
    return raw;
  }
}
