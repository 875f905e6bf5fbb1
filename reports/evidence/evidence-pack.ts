/**
 * The Evidence pack: one zip an assessor can keep, standing on its own: the round reports,
 * workbooks, the lab's individual reports and certificates, its investigations and its
 * instrument-check history (PDF to read, JSON beside them), an audit extract, a README and
 * manifest.json listing every file with its SHA-256 (the manifest does not list itself; the
 * README's count says so).
 */
import JSZip from 'jszip';
import type { EvidenceManifest } from '../../shared/contracts/reports';
import { sha256 } from '../model';

export interface EvidenceFile {
  /** Path inside the zip, forward slashes. */
  path: string;
  data: Buffer;
}

export interface EvidenceMeta {
  lab: string;
  generatedFor: string;
  generatedAt: string;
}

export function evidenceManifest(files: EvidenceFile[], meta: EvidenceMeta): EvidenceManifest {
  return {
    lab: meta.lab,
    generatedAt: meta.generatedAt,
    generatedFor: meta.generatedFor,
    files: files.map((f) => ({ path: f.path, sha256: sha256(f.data), bytes: f.data.length })),
  };
}

/** Lines of the README that describe the top-level files (the order of the zip). */
const DESCRIPTIONS: Record<string, string> = {
  'rounds.json':
    'the laboratory’s rounds with participant codes, evaluation versions and publication dates (JSON).',
  'investigations.pdf':
    'this laboratory’s investigations of warning and action signals: cause, corrective action, effectiveness check (readable).',
  'investigations.json': 'the same investigations as data (JSON).',
  'instrument-checks.pdf': 'its instrument checks against reference materials (readable).',
  'instrument-checks.json': 'the same instrument checks as data (JSON).',
  'audit-extract.json':
    'the audit-trail events about this laboratory, its investigations and the evaluation of its rounds (JSON).',
};

/**
 * The README: what the pack holds and how many files. `listed` is every file manifest.json
 * lists (the README included); the zip holds those plus manifest.json itself.
 */
export function evidenceReadme(meta: EvidenceMeta, listed: string[]): string {
  const top = listed.filter((p) => !p.includes('/') && p !== 'README.txt');
  const roundFiles = listed.filter((p) => p.startsWith('rounds/')).length;
  return [
    `Evidence pack`,
    ``,
    `Lab: ${meta.lab}`,
    `Made for: ${meta.generatedFor}`,
    `Made at: ${meta.generatedAt} (UTC)`,
    ``,
    `Contents`,
    `- rounds/<round code>/ (${roundFiles} files): the round report (PDF) and workbook (XLSX), this laboratory's individual report and certificate of participation.`,
    `  Other participants appear only by their participant codes.`,
    ...top.map((p) => `- ${p}: ${DESCRIPTIONS[p] ?? 'a record of the laboratory.'}`),
    `- README.txt: this file.`,
    `- manifest.json: the SHA-256 of every other file; check one with "sha256sum <file>".`,
    ``,
    `The zip holds ${listed.length + 1} files: the ${listed.length} listed in manifest.json (this README included) and manifest.json itself.`,
    ``,
  ].join('\n');
}

/** Zips the files with README.txt and manifest.json; resolves to the zip bytes. */
export async function buildEvidencePack(
  files: EvidenceFile[],
  meta: EvidenceMeta,
): Promise<Buffer> {
  const listed = [...files.map((f) => f.path), 'README.txt'];
  const readme = Buffer.from(evidenceReadme(meta, listed), 'utf8');
  const all = [...files, { path: 'README.txt', data: readme }];
  const manifest = evidenceManifest(all, meta);
  const zip = new JSZip();
  const date = new Date(meta.generatedAt);
  for (const f of all) zip.file(f.path, f.data, { date });
  zip.file('manifest.json', Buffer.from(JSON.stringify(manifest, null, 2), 'utf8'), { date });
  return zip.generateAsync({
    type: 'nodebuffer',
    compression: 'DEFLATE',
    compressionOptions: { level: 6 },
  });
}
