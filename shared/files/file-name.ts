/**
 * A safe display name for a file a client sent: no path, no control characters (C0, DEL, C1), no
 * quotes or bidirectional marks, NFC, at most 200 characters; 'file' when nothing is left. Pure:
 * the upload rule (api/src/http/uploads.ts) and the attachment service use the same one.
 */
export function cleanFileName(name: string): string {
  const base = name.split(/[\\/]/).pop() ?? '';
  const cleaned = Array.from(
    base
      .normalize('NFC')
      .replace(
        // eslint-disable-next-line no-control-regex -- dropping control characters is the point
        /[\u0000-\u001F\u007F-\u009F"\u2028\u2029\u200E\u200F\u202A-\u202E\u2066-\u2069]/g,
        '',
      )
      .trim(),
  )
    .slice(0, 200)
    .join('')
    .trim();
  return cleaned || 'file';
}
