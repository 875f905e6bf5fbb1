import { LOGO_MAX_BYTES } from '@ringlet/shared/contracts/provider';
import { base64OfDataUrl, logoAddress, logoSizeRefusal } from './logo-file';

describe('the logo file', () => {
  it('is refused above the size limit, and only above it', () => {
    expect(logoSizeRefusal(LOGO_MAX_BYTES)).toBeNull();
    expect(logoSizeRefusal(LOGO_MAX_BYTES + 1)).toBe('The logo may be at most 256 KB.');
  });
  it('is sent as the base64 part of the data URL', () => {
    expect(base64OfDataUrl('data:image/png;base64,iVBORw0KGgo=')).toBe('iVBORw0KGgo=');
    expect(base64OfDataUrl(null)).toBe('');
  });
  it('is fetched again whenever the profile changes', () => {
    expect(logoAddress('/api', '2026-03-02T10:00:00+01:00')).toBe(
      '/api/provider/logo?v=2026-03-02T10%3A00%3A00%2B01%3A00',
    );
    expect(logoAddress('/api', null)).toBe('/api/provider/logo');
  });
});
