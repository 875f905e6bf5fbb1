import { createInflateRaw } from 'node:zlib';

/**
 * Just enough of the zip format (PKWARE APPNOTE 6.3.x, sections 4.3.7, 4.3.12, 4.3.16) to list an
 * uploaded XLSX's parts and unpack them as a stream, so limits can be checked before a spreadsheet
 * library reads the whole file. Zip64 and encrypted entries are refused: an XLSX within the upload
 * limits needs neither.
 */

export interface ZipEntry {
  name: string;
  /** 0 stored, 8 deflate. */
  method: number;
  compressedSize: number;
  /** As declared in the central directory (not trusted: unpacking counts the real bytes). */
  uncompressedSize: number;
  localHeaderOffset: number;
}

export class ZipError extends Error {}

const EOCD = 0x06054b50;
const CENTRAL = 0x02014b50;
const LOCAL = 0x04034b50;

/** The entries of a zip from its central directory; throws ZipError when the file is not a readable zip. */
export function listZipEntries(buf: Buffer, maxEntries = 10_000): ZipEntry[] {
  if (buf.length < 22 || buf.readUInt32LE(0) !== LOCAL) throw new ZipError('not a zip file');
  // The end record sits in the last 22 bytes plus a comment of at most 65,535 bytes.
  let eocd = -1;
  for (let i = buf.length - 22; i >= Math.max(0, buf.length - 22 - 0xffff); i--) {
    if (buf.readUInt32LE(i) === EOCD) {
      eocd = i;
      break;
    }
  }
  if (eocd < 0) throw new ZipError('the zip has no end record (truncated or corrupt)');
  const count = buf.readUInt16LE(eocd + 10);
  const size = buf.readUInt32LE(eocd + 12);
  const offset = buf.readUInt32LE(eocd + 16);
  if (count === 0xffff || offset === 0xffffffff)
    throw new ZipError('zip64 archives are not accepted');
  if (count > maxEntries) throw new ZipError(`the zip has more than ${maxEntries} parts`);
  if (offset + size > eocd) throw new ZipError('the zip directory points outside the file');
  const entries: ZipEntry[] = [];
  let p = offset;
  for (let n = 0; n < count; n++) {
    if (p + 46 > eocd || buf.readUInt32LE(p) !== CENTRAL)
      throw new ZipError('the zip directory is corrupt');
    const flags = buf.readUInt16LE(p + 8);
    const method = buf.readUInt16LE(p + 10);
    const compressedSize = buf.readUInt32LE(p + 20);
    const uncompressedSize = buf.readUInt32LE(p + 24);
    const nameLen = buf.readUInt16LE(p + 28);
    const extraLen = buf.readUInt16LE(p + 30);
    const commentLen = buf.readUInt16LE(p + 32);
    const localHeaderOffset = buf.readUInt32LE(p + 42);
    const name = buf.subarray(p + 46, p + 46 + nameLen).toString('utf8');
    if (flags & 1) throw new ZipError(`${name} is encrypted`);
    if (method !== 0 && method !== 8)
      throw new ZipError(`${name} uses an unsupported compression method`);
    if (compressedSize === 0xffffffff || uncompressedSize === 0xffffffff)
      throw new ZipError('zip64 archives are not accepted');
    if (localHeaderOffset + 30 > buf.length)
      throw new ZipError('the zip directory points outside the file');
    entries.push({ name, method, compressedSize, uncompressedSize, localHeaderOffset });
    p += 46 + nameLen + extraLen + commentLen;
  }
  return entries;
}

/** The compressed bytes of one entry. */
function entryData(buf: Buffer, e: ZipEntry): Buffer {
  const h = e.localHeaderOffset;
  if (buf.readUInt32LE(h) !== LOCAL) throw new ZipError(`${e.name}: local header missing`);
  const start = h + 30 + buf.readUInt16LE(h + 26) + buf.readUInt16LE(h + 28);
  const end = start + e.compressedSize;
  if (end > buf.length) throw new ZipError(`${e.name}: data runs past the end of the file`);
  return buf.subarray(start, end);
}

/**
 * Unpacks one entry as a stream of chunks; `onChunk` returns false to stop early (a limit was
 * reached). Memory stays at one chunk whatever the entry unpacks to.
 */
export function inflateEntry(
  buf: Buffer,
  e: ZipEntry,
  onChunk: (chunk: Buffer) => boolean,
): Promise<void> {
  const data = entryData(buf, e);
  if (e.method === 0) {
    onChunk(data);
    return Promise.resolve();
  }
  return new Promise((resolve, reject) => {
    const inflate = createInflateRaw({ chunkSize: 64 * 1024 });
    let stopped = false;
    inflate.on('data', (chunk: Buffer) => {
      if (stopped) return;
      if (!onChunk(chunk)) {
        stopped = true;
        inflate.destroy();
        resolve();
      }
    });
    inflate.on('end', () => resolve());
    inflate.on('close', () => resolve());
    inflate.on('error', (err) =>
      stopped ? resolve() : reject(new ZipError(`${e.name}: ${err.message}`)),
    );
    inflate.end(data);
  });
}
