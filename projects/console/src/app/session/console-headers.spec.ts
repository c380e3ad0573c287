import { consoleHeaders } from './console-headers';

const none = () => false;
const ctx = { tenantSlug: 'larchmere', csrfToken: 'tok' };

describe('consoleHeaders', () => {
  it('adds the tenant to every API call and the CSRF token only to changes', () => {
    expect(consoleHeaders('GET', '/api/v1/members', none, ctx)).toEqual({
      'Tropline-Tenant': 'larchmere',
    });
    expect(consoleHeaders('delete', '/api/v1/console/keys/k1', none, ctx)).toEqual({
      'Tropline-Tenant': 'larchmere',
      'X-CSRF-Token': 'tok',
    });
  });

  it('keeps a tenant the caller named, and adds nothing outside the API', () => {
    const has = (name: string) => name === 'Tropline-Tenant';
    expect(consoleHeaders('POST', '/api/v1/invitations', has, ctx)).toEqual({
      'X-CSRF-Token': 'tok',
    });
    expect(consoleHeaders('POST', '/console/assets/x.js', none, ctx)).toEqual({});
  });

  it('sends nothing it does not have (signed out, no tenant)', () => {
    const empty = { tenantSlug: undefined, csrfToken: undefined };
    expect(consoleHeaders('POST', '/api/v1/session', none, empty)).toEqual({});
  });
});
