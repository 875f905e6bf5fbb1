import { linkify } from './linkify';

describe('linkify', () => {
  it('turns http(s) addresses into links and keeps the rest as text', () => {
    expect(linkify('Choose a password: http://127.0.0.1:3000/set-password/abc123. Thanks')).toEqual(
      [
        { text: 'Choose a password: ' },
        { href: 'http://127.0.0.1:3000/set-password/abc123' },
        { text: '. Thanks' },
      ],
    );
  });

  it('leaves text without links alone', () => {
    expect(linkify('No links here.')).toEqual([{ text: 'No links here.' }]);
  });
});
