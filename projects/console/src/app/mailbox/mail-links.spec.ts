import { linksIn } from './mail-links';

describe('linksIn', () => {
  it('finds each link once, drops trailing punctuation and names console links', () => {
    const text =
      'Accept: http://localhost:3000/console/invitation?token=abc_9.\n' +
      'Again: http://localhost:3000/console/invitation?token=abc_9\n' +
      'Docs (https://docs.example/guide), reset at https://x.example/console/password-reset?token=z';
    expect(linksIn(text)).toEqual([
      {
        href: 'http://localhost:3000/console/invitation?token=abc_9',
        label: 'Open the invitation',
      },
      { href: 'https://docs.example/guide', label: 'https://docs.example/guide' },
      {
        href: 'https://x.example/console/password-reset?token=z',
        label: 'Open the password link',
      },
    ]);
  });

  it('finds nothing in text without links', () => {
    expect(linksIn('No links here.')).toEqual([]);
  });
});
