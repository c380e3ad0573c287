import { chooseTenant, type SessionTenant } from '../session/session-types';
import { navFor, roleName } from './console-nav';

const paths = (role: Parameters<typeof navFor>[0], mailbox: boolean) =>
  navFor(role, mailbox).map((i) => i.path);

describe('navFor', () => {
  it('shows admins every page and viewers only what they may read', () => {
    expect(paths('admin', true)).toEqual([
      '/',
      '/scenarios',
      '/keys',
      '/usage',
      '/members',
      '/audit',
      '/mailbox',
      '/status',
    ]);
    expect(paths('viewer', false)).toEqual(['/', '/scenarios', '/usage', '/members', '/status']);
    expect(paths(undefined, false)).toEqual(['/', '/status']);
  });
});

describe('roleName', () => {
  it('names roles and leaves unknown values as they are', () => {
    expect(roleName('analyst')).toBe('Analyst');
    expect(roleName('ranger')).toBe('ranger');
  });
});

describe('chooseTenant', () => {
  const t = (slug: string): SessionTenant => ({ id: slug, slug, name: slug, role: 'viewer' });
  it('keeps the remembered tenant while the person belongs to it, else takes the first', () => {
    expect(chooseTenant([t('a'), t('b')], 'b')?.slug).toBe('b');
    expect(chooseTenant([t('a'), t('b')], 'gone')?.slug).toBe('a');
    expect(chooseTenant([], 'a')).toBeUndefined();
  });
});
