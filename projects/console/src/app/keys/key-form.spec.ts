import { normaliseOrigin, readKeyForm, type KeyFormValue } from './key-form';

const TODAY = '2026-06-15';
const form = (over: Partial<KeyFormValue>): KeyFormValue => ({
  kind: 'browser',
  name: '',
  origins: '',
  scopes: [],
  expires: '',
  ...over,
});

describe('normaliseOrigin', () => {
  it('accepts scheme, host and port, as the server stores them', () => {
    expect(normaliseOrigin('https://Portal.Example:8443/')).toBe('https://portal.example:8443');
    expect(normaliseOrigin(' http://localhost:4200 ')).toBe('http://localhost:4200');
  });

  it('refuses paths, queries, other schemes and bare hosts', () => {
    for (const bad of [
      'https://portal.example/maps',
      'https://portal.example/?a=1',
      'ftp://portal.example',
      'portal.example',
      'https://user@portal.example',
    ]) {
      expect(normaliseOrigin(bad), bad).toBeUndefined();
    }
  });
});

describe('readKeyForm', () => {
  it('builds a browser key body with normalised, de-duplicated origins and the browser scopes', () => {
    const read = readKeyForm(
      form({
        name: ' Portal ',
        origins: 'https://portal.example\nhttps://PORTAL.example/\n\nhttps://maps.portal.example',
        scopes: ['keys:manage'],
      }),
      TODAY,
    );
    expect(read.body).toEqual({
      kind: 'browser',
      name: 'Portal',
      scopes: ['compute', 'scenarios:read'],
      origins: ['https://portal.example', 'https://maps.portal.example'],
    });
  });

  it('names the lines that are not origins, and asks for one when none is given', () => {
    expect(readKeyForm(form({ origins: 'portal.example/x' }), TODAY).problems?.origins).toContain(
      'Not an origin: portal.example/x',
    );
    expect(readKeyForm(form({}), TODAY).problems?.origins).toContain('at least one origin');
  });

  it('needs a scope for a server key and sends no origins for it', () => {
    expect(readKeyForm(form({ kind: 'server' }), TODAY).problems?.scopes).toBe(
      'Choose at least one scope.',
    );
    const read = readKeyForm(
      form({ kind: 'server', scopes: ['usage:read'], origins: 'https://x.example' }),
      TODAY,
    );
    expect(read.body).toEqual({ kind: 'server', scopes: ['usage:read'] });
  });

  it('turns a future date into an expiry instant and refuses today or earlier', () => {
    const ok = readKeyForm(form({ origins: 'https://p.example', expires: '2026-07-01' }), TODAY);
    expect(ok.body?.expiresAt).toBe('2026-07-01T00:00:00.000Z');
    const past = readKeyForm(form({ origins: 'https://p.example', expires: TODAY }), TODAY);
    expect(past.problems?.expires).toBe('Choose a date after today.');
  });
});
