import { sniffFileType, sniffImageType } from './file-type';

// Signatures: PDF 1.7 (ISO 32000-1 §7.5.2 header "%PDF-"), PKWARE APPNOTE §4.3.7 local file
// header 0x04034b50, PNG (ISO/IEC 15948 §5.2), JPEG SOI + marker (ITU T.81 B.1.1.3), WebP RIFF
// container (RFC 9649 §2).
const bytes = (...b: number[]) => Uint8Array.from(b);
const ascii = (s: string) => Uint8Array.from([...s].map((c) => c.charCodeAt(0)));

describe('sniffFileType', () => {
  it('names each signature and nothing else', () => {
    expect(sniffFileType(ascii('%PDF-1.7\n'))).toBe('pdf');
    expect(sniffFileType(bytes(0x50, 0x4b, 0x03, 0x04, 0x14))).toBe('zip');
    expect(sniffFileType(bytes(0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0))).toBe('png');
    expect(sniffFileType(bytes(0xff, 0xd8, 0xff, 0xe0))).toBe('jpeg');
    expect(sniffFileType(ascii('RIFF\u0000\u0000\u0000\u0000WEBPVP8 '))).toBe('webp');
    expect(sniffFileType(ascii('tau,g2\n1e-6,0.8\n'))).toBeNull();
    expect(sniffFileType(ascii('%PDF'))).toBeNull();
    expect(sniffFileType(bytes(0x89, 0x50, 0x4e, 0x47))).toBeNull();
  });

  it('gives an image MIME type only among the allowed kinds', () => {
    const webp = ascii('RIFF\u0000\u0000\u0000\u0000WEBPVP8 ');
    expect(sniffImageType(webp, ['png', 'jpeg', 'webp'])).toBe('image/webp');
    expect(sniffImageType(webp, ['png', 'jpeg'])).toBeNull();
    expect(sniffImageType(ascii('%PDF-1.4'), ['png', 'jpeg'])).toBeNull();
  });
});
