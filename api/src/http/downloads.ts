import type { Response } from 'express';
import { sha256 } from '../../../reports/model';

/** A file the API hands out: its bytes, type, the name offered to save it under, its checksum. */
export interface Download {
  file: Buffer;
  contentType: string;
  fileName: string;
  /** SHA-256 of `file` in hex, when already known (computed otherwise). */
  sha256?: string;
}

/**
 * The one way a route answers with a file: an attachment under a header-safe name (plus the
 * UTF-8 name, RFC 6266), the SHA-256 in X-Content-SHA256 so the reader can check what arrived,
 * and never cached (files hold a lab's results or a round's names).
 */
export function sendDownload(res: Response, d: Download): void {
  res.setHeader('Content-Type', d.contentType);
  res.setHeader(
    'Content-Disposition',
    `attachment; filename="${d.fileName.replace(/[^\x20-\x7e]|"/g, '_')}"; filename*=UTF-8''${encodeURIComponent(d.fileName)}`,
  );
  res.setHeader('X-Content-SHA256', d.sha256 ?? sha256(d.file));
  res.setHeader('Cache-Control', 'private, no-store');
  res.status(200).send(d.file);
}
