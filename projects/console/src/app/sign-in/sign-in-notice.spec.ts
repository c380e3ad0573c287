import { safeNext, signInNotice } from './sign-in-notice';

describe('safeNext', () => {
  it('follows console paths only', () => {
    expect(safeNext('/keys?state=active')).toBe('/keys?state=active');
    for (const bad of [undefined, '', 'https://elsewhere.example', '//elsewhere.example', '/\\x']) {
      expect(safeNext(bad), String(bad)).toBe('/');
    }
    expect(safeNext('/sign-in?next=/keys')).toBe('/');
  });
});

describe('signInNotice', () => {
  it('says why someone is on the sign-in page', () => {
    expect(signInNotice({ done: 'reset' })).toContain('password was changed');
    expect(signInNotice({ out: 'all' })).toBe('You are signed out on every device.');
    expect(signInNotice({ ended: '1' })).toContain('session ended');
    expect(signInNotice({})).toBeUndefined();
  });
});
