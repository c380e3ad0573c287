import { describe, expect, it } from 'vitest';
import { passwordProblems } from './password-policy';

describe('passwordProblems', () => {
  it('accepts a long, uncommon password', () => {
    expect(passwordProblems('sedge-and-pike-at-noon', 'a@b.example')).toEqual([]);
  });

  it.each([
    ['too short', 'elevenchars', /at least 12/],
    ['too long', 'x'.repeat(257) + 'yz', /at most 256/],
    ['common', 'Password1234', /most common/],
    ['the e-mail address', 'wren.ashdown@larchmere.example', /e-mail/],
    ['one repeated character', 'aaaaaaaaaaaaaaab', /too few different/],
  ])('refuses %s, naming /password', (_why, password, message) => {
    const problems = passwordProblems(password, 'wren.ashdown@larchmere.example');
    expect(problems).toEqual([{ pointer: '/password', message: expect.stringMatching(message) }]);
  });

  it('counts characters, not UTF-16 units', () => {
    expect(passwordProblems('🦦🦦🦦🦦🦦🦦', undefined)[0]!.message).toMatch(/at least 12/);
  });
});
