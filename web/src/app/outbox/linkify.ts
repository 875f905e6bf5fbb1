/** A piece of mail text: plain text or a web link. */
export type TextPart = { readonly text: string } | { readonly href: string };

const URL_PATTERN = /https?:\/\/[^\s<>"')\]]+/g;

/** Splits text into plain parts and http(s) links, so links can be rendered as anchors. */
export function linkify(text: string): TextPart[] {
  const parts: TextPart[] = [];
  let last = 0;
  for (const match of text.matchAll(URL_PATTERN)) {
    const start = match.index ?? 0;
    // A sentence's closing full stop or comma is not part of the link.
    const href = match[0].replace(/[.,;:!?]+$/, '');
    if (start > last) parts.push({ text: text.slice(last, start) });
    parts.push({ href });
    last = start + href.length;
  }
  if (last < text.length) parts.push({ text: text.slice(last) });
  return parts;
}
