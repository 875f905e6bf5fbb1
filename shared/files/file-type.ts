/**
 * What a file is, read from its first bytes (never from its name or the type the sender claims).
 * The one list of signatures: PDF `%PDF-`, ZIP `PK\x03\x04` (XLSX and other Office files are zips;
 * the caller looks inside), PNG, JPEG, WebP. Pure: works on a Buffer or a browser Uint8Array.
 */
export type SniffedType = 'pdf' | 'zip' | 'png' | 'jpeg' | 'webp';

export const MIME_TYPES = {
  pdf: 'application/pdf',
  zip: 'application/zip',
  png: 'image/png',
  jpeg: 'image/jpeg',
  webp: 'image/webp',
} as const satisfies Record<SniffedType, string>;

const SIGNATURES: readonly { type: SniffedType; at: number; bytes: readonly number[] }[] = [
  { type: 'pdf', at: 0, bytes: [0x25, 0x50, 0x44, 0x46, 0x2d] }, // %PDF-
  { type: 'zip', at: 0, bytes: [0x50, 0x4b, 0x03, 0x04] }, // PK\x03\x04
  { type: 'png', at: 0, bytes: [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a] },
  { type: 'jpeg', at: 0, bytes: [0xff, 0xd8, 0xff] },
];

const has = (buf: Uint8Array, at: number, bytes: readonly number[]): boolean =>
  buf.length >= at + bytes.length && bytes.every((b, i) => buf[at + i] === b);

/** The file's type from its signature, or null for none of these (e.g. text). */
export function sniffFileType(buf: Uint8Array): SniffedType | null {
  for (const s of SIGNATURES) if (has(buf, s.at, s.bytes)) return s.type;
  // RIFF....WEBP
  if (has(buf, 0, [0x52, 0x49, 0x46, 0x46]) && has(buf, 8, [0x57, 0x45, 0x42, 0x50])) return 'webp';
  return null;
}

/** The MIME type of an image among `allowed`, from its first bytes; null for anything else. */
export function sniffImageType<T extends 'png' | 'jpeg' | 'webp'>(
  buf: Uint8Array,
  allowed: readonly T[],
): (typeof MIME_TYPES)[T] | null {
  const t = sniffFileType(buf);
  return t !== null && (allowed as readonly string[]).includes(t) ? MIME_TYPES[t as T] : null;
}
