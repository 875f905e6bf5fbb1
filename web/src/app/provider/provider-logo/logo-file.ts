import { LOGO_MAX_BYTES } from '@ringlet/shared/contracts/provider';

/** The largest logo, in KB as the page states it. */
export const LOGO_MAX_KB = LOGO_MAX_BYTES / 1024;

/** Why a picked logo file is refused before it is read, or null when its size is fine. */
export function logoSizeRefusal(bytes: number): string | null {
  return bytes > LOGO_MAX_BYTES ? `The logo may be at most ${LOGO_MAX_KB} KB.` : null;
}

/** The base64 part of a `data:` URL (what FileReader.readAsDataURL gives); '' for anything else. */
export function base64OfDataUrl(result: unknown): string {
  const data = typeof result === 'string' ? result : '';
  return data.slice(data.indexOf(',') + 1);
}

/** The logo's address, changed whenever the profile changes so the browser fetches it again. */
export function logoAddress(api: string, updatedAt: string | null): string {
  return updatedAt
    ? `${api}/provider/logo?v=${encodeURIComponent(updatedAt)}`
    : `${api}/provider/logo`;
}
