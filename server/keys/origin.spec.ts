import { describe, expect, it } from 'vitest';
import { normaliseOrigin } from './keys-service';

// An origin is scheme, host and port only (RFC 6454 §6.1, the serialisation of an origin).
describe('normaliseOrigin', () => {
  it('lowercases and drops a bare trailing slash', () => {
    expect(normaliseOrigin('https://Portal.Example:8443/')).toBe('https://portal.example:8443');
  });

  it('refuses an empty fragment or query, which URL parsing would silently drop', () => {
    // Found by the hostile-bodies fuzz test (seed -540979130): `http://a.aa#` was stored as an origin.
    expect(normaliseOrigin('http://a.aa#')).toBeUndefined();
    expect(normaliseOrigin('http://a.aa?')).toBeUndefined();
    expect(normaliseOrigin('http://user:pw@a.aa')).toBeUndefined();
  });
});
